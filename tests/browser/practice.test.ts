import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifact, openBrowser } from '../setup/browser'
import { TEST_PASSWORD, closeTestDb, createPractice, type PracticeFixture } from '../api/support/accounts'

let browser: BrowserContext
let practice: PracticeFixture

async function signIn(email: string): Promise<Page> {
  const page = await browser.newPage()
  await page.goto(`${inject('baseUrl')}/sign-in`)
  await page.waitForSelector('[data-hydrated="true"]')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD)
  await page.getByRole('button', { name: /sign in/i }).click()
  await page.waitForURL(/\/home/)
  return page
}

beforeAll(async () => {
  browser = await openBrowser()
  practice = await createPractice('Guideline practice')
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('practice settings', () => {
  it('lets the owner switch the practice to the 2023 ESH grades, which the blood pressure check then follows', async () => {
    const page = await signIn(practice.people.owner.email)
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: /^Practice/ }).click()
    await page.waitForURL(/\/practice/)
    await page.getByLabel(/2023 ESH/).check()
    await page.getByRole('button', { name: 'Save the settings' }).click()
    await page.getByText('The practice settings are saved.').waitFor()
    await page.screenshot({ path: artifact('practice-settings-1280.png'), fullPage: true })

    await page.goto(`${inject('baseUrl')}/bp-check`)
    await page.waitForSelector('[data-hydrated="true"]')
    await page.getByLabel('Reading 1, systolic').fill('145')
    await page.getByLabel('Reading 1, diastolic').fill('85')
    await page.getByRole('button', { name: 'Check the readings' }).click()
    // ESH 2023: systolic 140–159 is grade 1 (Mancia et al., J Hypertens 2023;41:1874).
    expect(await page.locator('table').textContent()).toMatch(/145\/85.*Grade 1 hypertension/)
    await page.close()
  })

  it('is not among a senior coach\'s areas, and the server refuses the change', async () => {
    const page = await signIn(practice.people.senior_coach.email)
    const areas = await page.getByRole('navigation', { name: 'Areas' }).textContent()
    expect(areas).not.toMatch(/Practice/)
    const status = await page.evaluate(async () => (await fetch('/api/practice', {
      method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ guideline: 'acc-aha-2017' }),
    })).status)
    expect(status).toBe(403)
    await page.close()
  })
})

import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifact, openBrowser } from '../setup/browser'

// A client of the demo practice checks their own readings; the demo accounts share one password.
const CLIENT = 'joel.client@tidewell.example.test'
const PASSWORD = 'lamina-demo-2026'

let browser: BrowserContext
let page: Page
beforeAll(async () => {
  browser = await openBrowser()
  page = await browser.newPage()
  await page.goto(`${inject('baseUrl')}/sign-in`)
  await page.waitForSelector('[data-hydrated="true"]')
  await page.getByLabel('E-mail').fill(CLIENT)
  await page.getByLabel('Password', { exact: true }).fill(PASSWORD)
  await page.getByRole('button', { name: /sign in/i }).click()
  await page.waitForURL(/\/home/)
})
afterAll(async () => { await browser?.close() })

describe('blood pressure check', () => {
  it('is one of the areas on a client\'s home page', async () => {
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: /Blood pressure/ }).click()
    await page.waitForURL(/\/bp-check/)
    await page.waitForSelector('[data-hydrated="true"]')
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toMatch(/Blood pressure check/)
  })

  it('names a reading in the crisis range and tells the person not to start exercise (Whelton et al., Hypertension 2018;71:e13–e115)', async () => {
    await page.getByLabel('Reading 1, systolic').fill('182')
    await page.getByLabel('Reading 1, diastolic').fill('100')
    await page.getByRole('button', { name: 'Add a reading' }).click()
    await page.getByLabel('Reading 2, systolic').fill('118')
    await page.getByLabel('Reading 2, diastolic').fill('76')
    await page.getByRole('button', { name: 'Check the readings' }).click()
    const alert = page.getByRole('alert').filter({ hasText: 'Very high blood pressure' })
    await alert.waitFor()
    const table = await page.locator('table').textContent()
    expect(table).toMatch(/182\/100.*Crisis range/)
    expect(table).toMatch(/118\/76.*Normal/)
    // Average 150/88 is stage 2 by the systolic value alone.
    expect(await page.locator('section[aria-labelledby="bp-result-heading"]').textContent()).toMatch(/150\/88.*Stage 2 hypertension/)
    expect(await page.textContent('body')).toMatch(/Not enough readings/)
    await page.screenshot({ path: artifact('bp-check-1280.png'), fullPage: true })
  })

  it('says which reading is wrong when systolic is not above diastolic, keeping what was typed', async () => {
    await page.getByLabel('Reading 2, systolic').fill('70')
    await page.getByLabel('Reading 2, diastolic').fill('90')
    await page.getByRole('button', { name: 'Check the readings' }).click()
    await page.getByText(/Reading 2: Systolic must be higher than diastolic/).waitFor()
    expect(await page.getByLabel('Reading 2, systolic').inputValue()).toBe('70')
    expect(await page.getByLabel('Reading 1, systolic').inputValue()).toBe('182')
  })

  it('fits a 390 px phone screen', async () => {
    await page.setViewportSize({ width: 390, height: 844 })
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await page.screenshot({ path: artifact('bp-check-390.png'), fullPage: true })
  })
})

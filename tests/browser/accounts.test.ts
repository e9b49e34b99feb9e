// In Chromium: an invitation e-mail caught by the local SMTP server, its link followed, a password
// chosen, and the person signed in with the role the owner picked. Also sign-in with inline
// field errors, no Content-Security-Policy violations, and the members page at phone width.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inject } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { artifact, openBrowser } from '../setup/browser'
import { TEST_PASSWORD, closeTestDb, createPractice, linkIn, mailTo, resetRateLimits, signedIn, uniqueEmail, type PracticeFixture } from '../api/support/accounts'

let browser: BrowserContext
let practice: PracticeFixture
const problems: string[] = []

async function open(path: string, width = 1280): Promise<Page> {
  // Each test starts signed out: the profile is shared, its cookies are not.
  await browser.clearCookies()
  const page = await browser.newPage()
  await page.setViewportSize({ width, height: 860 })
  page.on('console', (m) => { if (m.type() === 'error') problems.push(m.text()) })
  page.on('pageerror', e => problems.push(e.message))
  await page.goto(inject('baseUrl') + path)
  await page.waitForSelector('[data-hydrated="true"]', { timeout: 15_000 })
  return page
}

beforeAll(async () => {
  await resetRateLimits()
  practice = await createPractice('Browser')
  browser = await openBrowser()
})
afterAll(async () => {
  await browser?.close()
  await resetRateLimits()
  await closeTestDb()
})

describe('accounts in the browser', () => {
  it('follows an e-mailed invitation, sets a password and lands signed in as a junior coach', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const email = uniqueEmail('newcoach')
    expect((await owner.post('/api/invitations', { email, role: 'junior_coach', name: 'Pia Newcoach' })).status).toBe(201)
    const mail = await mailTo(email)
    expect(mail.subject).toContain(practice.name)
    expect(mail.text).toMatch(/as a junior coach/)
    const link = linkIn(mail, '/invite/')
    expect(link.startsWith(inject('baseUrl'))).toBe(true)

    const page = await open(new URL(link).pathname)
    await expect(page.locator('[data-role]').first().textContent()).resolves.toBe('Junior coach')
    await page.getByLabel('Your name').fill('Pia Newcoach')
    await page.getByLabel('Choose a password').fill('short')
    await page.getByRole('button', { name: 'Accept and join' }).click()
    // The server's field error appears inline, and what was typed stays.
    await page.getByText('A password needs at least 10 characters.').waitFor()
    expect(await page.getByLabel('Your name').inputValue()).toBe('Pia Newcoach')
    await page.screenshot({ path: artifact('invite-field-error.png') })

    await page.getByLabel('Choose a password').fill('a-good-long-password')
    await page.getByRole('button', { name: 'Accept and join' }).click()
    await page.waitForURL(/\/home$/)
    await page.getByText('Junior coach', { exact: true }).first().waitFor()
    const me = await page.request.get(`${inject('baseUrl')}/api/me`)
    expect(await me.json()).toMatchObject({ role: 'junior_coach', user: { email, name: 'Pia Newcoach' }, practice: { id: practice.id } })
    await page.screenshot({ path: artifact('invite-landed.png') })
    await page.close()
  })

  it('sends an anonymous visitor to sign-in and back, with inline errors on the way', async () => {
    const page = await open('/members')
    await page.waitForURL(/\/sign-in\?next=(%2F|\/)members$/)
    await page.getByLabel('E-mail').fill(practice.people.owner.email)
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('alert').getByText('That e-mail and password do not match an account.').waitFor()
    expect(await page.getByLabel('E-mail').inputValue()).toBe(practice.people.owner.email)
    await page.getByLabel('Password').fill(TEST_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(/\/members$/)
    await page.locator(`[data-member="${practice.people.client.email}"]`).waitFor()
    await page.screenshot({ path: artifact('members-1280.png'), fullPage: true })
    await page.setViewportSize({ width: 390, height: 844 })
    await page.screenshot({ path: artifact('members-390.png'), fullPage: true })
    const wide = await page.evaluate(() => [...document.querySelectorAll('body *')]
      .filter(el => el.getBoundingClientRect().right > window.innerWidth + 1 && !el.closest('.overflow-x-auto'))
      .map(el => `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)}`).slice(0, 8))
    expect(wide).toEqual([])
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0)
    await page.close()
    await resetRateLimits()
  })

  it('signs out from the account menu', async () => {
    const page = await open('/sign-in')
    await page.getByLabel('E-mail').fill(practice.people.reviewer.email)
    await page.getByLabel('Password').fill(TEST_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(/\/home$/)
    await page.locator('[data-account-menu] summary').click()
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in$/)
    expect((await page.request.get(`${inject('baseUrl')}/api/me`)).status()).toBe(401)
    await page.close()
  })

  it('the sign-in page fits a phone screen', async () => {
    const page = await open('/sign-in', 390)
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await page.screenshot({ path: artifact('sign-in-390.png') })
    await page.close()
  })

  it('hydrated every page without a Content-Security-Policy violation or script error', () => {
    expect(problems.filter(p => !/401|Unauthorized|status of 4\d\d/.test(p))).toEqual([])
  })
})

import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { artifact, openBrowser } from '../setup/browser'

let browser: BrowserContext
beforeAll(async () => { browser = await openBrowser() })
afterAll(async () => { await browser?.close() })

describe('landing page', () => {
  it('renders in the shipped Space Grotesk with no request leaving the machine', async () => {
    const page = await browser.newPage()
    const base = new URL(inject('baseUrl'))
    const external: string[] = []
    const fonts: string[] = []
    page.on('request', (request) => {
      const url = new URL(request.url())
      if (url.protocol !== 'data:' && url.host !== base.host) external.push(request.url())
      if (request.resourceType() === 'font') fonts.push(request.url())
    })
    await page.goto(base.href, { waitUntil: 'networkidle' })
    await page.waitForSelector('[data-hydrated="true"]')

    const family = await page.evaluate(() => getComputedStyle(document.querySelector('h1')!).fontFamily)
    expect(family.split(',')[0]!.replace(/["']/g, '').trim()).toBe('Space Grotesk')
    // The face was really loaded from the app's own files, not a system fallback.
    const loaded = await page.evaluate(async () => {
      await document.fonts.ready
      return [...document.fonts].filter(f => f.family.replace(/["']/g, '') === 'Space Grotesk' && f.status === 'loaded').length
    })
    expect(loaded).toBeGreaterThan(0)
    expect(fonts.length).toBeGreaterThan(0)
    expect(fonts.every(url => url.startsWith(base.origin))).toBe(true)
    expect(external).toEqual([])

    expect(await page.getByRole('heading', { level: 1 }).count()).toBe(1)
    expect(await page.textContent('body')).toMatch(/supports, not replaces, medical advice/)
    await page.screenshot({ path: artifact('landing-1280.png'), fullPage: true })
    await page.close()
  })

  it('fits a 390 px phone screen without sideways scrolling', async () => {
    const page = await browser.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await page.goto(inject('baseUrl'), { waitUntil: 'networkidle' })
    await page.waitForSelector('[data-hydrated="true"]')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await page.screenshot({ path: artifact('landing-390.png'), fullPage: true })
    await page.close()
  })
})

// The studio in Chromium: drag and drop with a real mouse, the keyboard path, live
// analysis, undo and redo, autosave, a revision conflict, accessibility and the pacer.
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { BrowserContext, Locator, Page } from 'playwright-core'
import { analyze } from '../../shared/protocol/analyze'
import type { Protocol } from '../../shared/protocol/schema'
import type { Interval } from '../../shared/protocol/timeline'
import { artifact, openBrowser } from '../setup/browser'

const SENIOR = 'tobias.senior@tidewell.example.test'
const PASSWORD = 'lamina-demo-2026'
const base = () => inject('baseUrl')
let browser: BrowserContext
let page: Page

/** A real mouse drag in small steps: SortableJS only follows a pointer that moves gradually. */
async function drag(from: Locator, to: Locator, where: 'start' | 'end' | 'center' = 'end') {
  await from.scrollIntoViewIfNeeded()
  const a = (await from.boundingBox())!
  const b = (await to.boundingBox())!
  const sx = a.x + a.width / 2
  const sy = a.y + a.height / 2
  const tx = where === 'start' ? b.x + 8 : where === 'end' ? b.x + b.width - 12 : b.x + b.width / 2
  const ty = b.y + b.height / 2
  await page.mouse.move(sx, sy)
  await page.mouse.down()
  for (let i = 1; i <= 30; i++) {
    await page.mouse.move(sx + ((tx - sx) * i) / 30, sy + ((ty - sy) * i) / 30)
    await page.waitForTimeout(20)
  }
  await page.waitForTimeout(50)
  await page.mouse.up()
  await page.waitForTimeout(150)
}

const api = <T = any>(path: string, init: { method?: string, body?: unknown } = {}) =>
  page.evaluate(async ({ path, init }) => {
    const res = await fetch(path, { method: init.method ?? 'GET', headers: { 'content-type': 'application/json' }, body: init.body === undefined ? undefined : JSON.stringify(init.body) })
    return { status: res.status, body: await res.json() }
  }, { path, init }) as Promise<{ status: number, body: T }>

async function newProtocol(name: string, starter?: string) {
  const created = await api('/api/templates', { method: 'POST', body: starter ? { starter } : { name } })
  expect(created.status).toBe(201)
  return created.body.template.id as string
}

async function openStudio(id: string, query = '') {
  await page.goto(`${base()}/studio/${id}${query}`)
  await page.waitForSelector('[data-hydrated="true"]')
  await page.waitForSelector('[data-studio-state="ready"]')
}

const metric = (key: string) => page.locator(`[data-metric="${key}"] dd`).textContent()
const bodyTrack = () => page.locator('[data-track-kind="body"] [data-track-list]').first()
const breathTrack = () => page.locator('[data-track-kind="breath"] [data-track-list]').first()
const blockIds = (track: Locator) => track.locator('.studio-block').evaluateAll(els => els.map(e => (e as HTMLElement).dataset.kind))
const waitSaved = () => page.waitForSelector('[data-save-status][data-status="saved"]', { timeout: 15_000 })

/** The saved draft reduced to what a coach sees (kinds, library blocks, numbers, ties by position). */
function shape(doc: Protocol) {
  const holds = new Map<string, string>()
  doc.tracks.forEach((t, ti) => t.blocks.forEach((b, bi) => b.id && holds.set(b.id, `${ti}:${bi}`)))
  return doc.tracks.map(t => t.blocks.map((b) => {
    const { id, during, ...rest } = b as Record<string, unknown> & { during?: { id?: string } }
    void id
    return { ...rest, during: during?.id ? holds.get(during.id) : undefined }
  }))
}

beforeAll(async () => {
  browser = await openBrowser()
  page = await browser.newPage()
  await page.goto(`${base()}/sign-in`)
  await page.waitForSelector('[data-hydrated="true"]')
  const signIn = await api('/api/auth/sign-in', { method: 'POST', body: { email: SENIOR, password: PASSWORD } })
  expect(signIn.status).toBe(200)
})
afterAll(async () => { await browser?.close() })

describe('studio', () => {
  let mouseId = ''

  it('drags a hold from the palette onto the body track and shows it on the timeline and in the metrics', async () => {
    mouseId = await newProtocol('Dragged with the mouse')
    await openStudio(mouseId)
    expect(await metric('tensionSeconds')).toBe('0 s')
    await drag(page.locator('[data-palette-block="wall-squat"]'), bodyTrack())
    await expect.poll(() => bodyTrack().locator('.studio-block').count()).toBe(1)
    // Library default 4 × 2 min holds with 2 min rests, as in the wall-squat protocol of
    // Wiles et al., J Sports Sci 2017 (value from memory): 8 min under tension, 14 min in all.
    expect(await metric('tensionSeconds')).toBe('8:00')
    expect(await metric('sessionSeconds')).toBe('14:00')
    expect(await page.locator('[data-studio-announce]').textContent()).toMatch(/Added Wall squat/)
  })

  it('ties a breathing pattern to the hold and the breath-held-under-tension figure follows', async () => {
    await drag(page.locator('[data-palette-block="pattern-4-7-8"]'), breathTrack())
    await expect.poll(() => breathTrack().locator('.studio-block').count()).toBe(1)
    const free = await metric('retentionUnderTensionSeconds')
    await breathTrack().locator('.studio-block').first().click()
    await page.getByLabel('During a hold').check()
    // 4-7-8 breathing (in 4 s, hold 7 s, out 8 s; common practice) in a 120 s set: six whole
    // cycles hold 42 s, the seventh is cut after 2 s of its hold: 44 s a set, 176 s over 4 sets.
    await expect.poll(() => metric('retentionUnderTensionSeconds')).toBe('2:56')
    expect(free).not.toBe('2:56')
    expect(await metric('longestRetentionUnderTensionSeconds')).toBe('7 s')
    // The hold now draws the breathing inside its sets.
    expect(await page.locator('[data-kind="hold"]').getAttribute('data-breath-sets')).toBe('4')
  })

  it('reorders by dragging, and undo and redo step through it', async () => {
    await drag(page.locator('[data-palette-block="rest-seated"]'), bodyTrack())
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    await drag(bodyTrack().locator('[data-kind="rest"]'), bodyTrack().locator('[data-kind="hold"]'), 'start')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
    expect(await page.locator('[data-studio-announce]').textContent()).toMatch(/Moved Seated rest to position 1/i)

    await page.locator('[data-undo]').click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    await page.locator('[data-redo]').click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
    // The shortcuts do the same from anywhere outside a text field.
    await page.locator('h2#studio-tracks-title').click()
    await page.keyboard.press('Control+z')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    await page.keyboard.press('Control+Shift+z')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
  })

  it('autosaves, and a reload shows the saved draft', async () => {
    await waitSaved()
    const rev = Number((await page.locator('[data-revision]').textContent())!.replace(/\D/g, ''))
    expect(rev).toBeGreaterThan(1)
    await page.reload()
    await page.waitForSelector('[data-studio-state="ready"]')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
    expect(await metric('retentionUnderTensionSeconds')).toBe('2:56')
  })

  it('reaches the same protocol with the keyboard alone, announcing each change', async () => {
    const keysId = await newProtocol('Built with the keyboard')
    await openStudio(keysId)
    await page.locator('[data-palette-block="wall-squat"]').focus()
    await page.keyboard.press('Enter')
    await page.locator('[data-palette-block="pattern-4-7-8"]').focus()
    await page.keyboard.press('Enter')
    await page.locator('[data-palette-block="rest-seated"]').focus()
    await page.keyboard.press('Enter')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    // Focus the rest on the track, move it one place left with Alt+ArrowLeft.
    await bodyTrack().locator('[data-kind="rest"]').focus()
    await page.keyboard.press('Alt+ArrowLeft')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
    expect(await page.locator('[data-studio-announce]').textContent()).toMatch(/Moved Seated rest to position 1/)
    expect(await page.evaluate(() => (document.activeElement as HTMLElement).dataset.kind)).toBe('rest')
    // Down to the breath track, open the block with Enter, tie it with the keyboard.
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('Enter')
    await page.getByLabel('During a hold').focus()
    await page.keyboard.press('Space')
    await expect.poll(() => metric('retentionUnderTensionSeconds')).toBe('2:56')
    await waitSaved()

    const byMouse = await api(`/api/templates/${mouseId}/draft`)
    const byKeys = await api(`/api/templates/${keysId}/draft`)
    expect(shape(byKeys.body.draft.document)).toEqual(shape(byMouse.body.draft.document))

    // Delete removes the focused block, and undo brings it back.
    await bodyTrack().locator('[data-kind="rest"]').focus()
    await page.keyboard.press('Delete')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold'])
    expect(await page.locator('[data-studio-announce]').textContent()).toMatch(/Removed Seated rest/)
    await page.locator('[data-undo]').click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['rest', 'hold'])
  })

  it('undoes at least 50 steps, back to the empty protocol', async () => {
    await openStudio(await newProtocol('Many steps'))
    for (const id of ['wall-squat', 'rest-seated']) {
      await page.locator(`[data-palette-block="${id}"]`).focus()
      await page.keyboard.press('Enter')
    }
    await bodyTrack().locator('[data-kind="rest"]').focus()
    for (let i = 0; i < 30; i++) {
      await page.keyboard.press('Alt+ArrowLeft')
      await page.keyboard.press('Alt+ArrowRight')
    }
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    const undo = page.locator('[data-undo]')
    for (let i = 0; i < 61; i++) await undo.click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold'])
    await undo.click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual([])
    expect(await undo.isDisabled()).toBe(true)
    await page.locator('[data-redo]').click()
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold'])
  })

  it('removes a block dragged out to the bin', async () => {
    await openStudio(await newProtocol('Bin'))
    for (const id of ['wall-squat', 'rest-seated']) {
      await page.locator(`[data-palette-block="${id}"]`).focus()
      await page.keyboard.press('Enter')
    }
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold', 'rest'])
    await drag(bodyTrack().locator('[data-kind="rest"]'), page.locator('[data-studio-bin]'), 'center')
    await expect.poll(() => blockIds(bodyTrack())).toEqual(['hold'])
  })

  it('shows both versions when a newer revision was saved elsewhere, and loses neither', async () => {
    const id = await newProtocol('Conflict at hand')
    await openStudio(id)
    await page.locator('[data-palette-block="wall-squat"]').focus()
    await page.keyboard.press('Enter')
    await waitSaved()
    // Behind the page's back, another tab saves a different draft.
    const stored = await api(`/api/templates/${id}/draft`)
    const theirs = { ...stored.body.draft.document, name: 'Changed in another tab' }
    theirs.tracks[0].blocks = []
    const put = await api(`/api/templates/${id}/draft`, { method: 'PUT', body: { document: theirs, baseRevision: stored.body.draft.revision } })
    expect(put.status).toBe(200)

    await page.locator('[data-palette-block="handgrip-hold"]').focus()
    await page.keyboard.press('Enter')
    await page.waitForSelector('[data-studio-conflict]', { timeout: 15_000 })
    expect(await page.locator('[data-save-status]').getAttribute('data-status')).toBe('conflict')
    expect(await page.locator('[data-conflict-side="mine"] [data-conflict-blocks]').textContent()).toBe('2')
    expect(await page.locator('[data-conflict-side="theirs"] [data-conflict-blocks]').textContent()).toBe('0')
    expect(await page.locator('[data-conflict-side="theirs"]').textContent()).toContain('Changed in another tab')
    await page.screenshot({ path: artifact('studio-conflict-1280.png'), fullPage: true })

    // Take theirs: the page shows their draft; undo brings this page's version back.
    await page.locator('[data-conflict-take]').click()
    await expect.poll(() => bodyTrack().locator('.studio-block').count()).toBe(0)
    expect(await page.locator('#studio-name').inputValue()).toBe('Changed in another tab')
    await page.locator('[data-undo]').click()
    await expect.poll(() => bodyTrack().locator('.studio-block').count()).toBe(2)
    await waitSaved()
    const after = await api(`/api/templates/${id}/draft`)
    expect(after.body.draft.revision).toBe(put.body.revision + 1)
    expect(after.body.draft.document.tracks[0].blocks).toHaveLength(2)
  })

  it('has no serious or critical accessibility violations (axe-core)', async () => {
    const starters = (await api('/api/starters')).body.starters as { id: string }[]
    await openStudio(await newProtocol('Accessibility check', starters[0]!.id))
    await page.locator('[data-studio-profile]').selectOption({ index: 3 })
    await bodyTrack().locator('.studio-block').first().click()
    const axePath = createRequire(import.meta.url).resolve('axe-core/axe.min.js')
    // Evaluated through the DevTools protocol, so the app's Content-Security-Policy does not block it.
    await page.evaluate(readFileSync(axePath, 'utf8'))
    const result = await page.evaluate(async () => {
      // @ts-expect-error axe is injected above
      const r = await window.axe.run(document, { resultTypes: ['violations'] })
      return r.violations.map((v: { id: string, impact: string, nodes: { target: string[] }[] }) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3).map(n => n.target.join(' ')) }))
    })
    expect(result.filter((v: { impact: string }) => v.impact === 'serious' || v.impact === 'critical')).toEqual([])
    // The example client has a very high reading: contraindication findings appear, errors apart from warnings.
    expect(await page.locator('[data-finding]').count()).toBeGreaterThan(0)
    await page.screenshot({ path: artifact('studio-findings-1280.png'), fullPage: true })
  })

  it('plays the pacer at high speed showing the phases of the engine\'s timeline', async () => {
    const id = await newProtocol('Pacer check')
    await openStudio(id)
    await page.locator('[data-palette-block="wall-squat"]').focus()
    await page.keyboard.press('Enter')
    await page.locator('[data-palette-block="pattern-4-7-8"]').focus()
    await page.keyboard.press('Enter')
    await page.getByLabel('During a hold').check()
    await waitSaved()
    const speed = 60
    await openStudio(id, `?pacerSpeed=${speed}&pacer=1`)
    const doc = (await api(`/api/templates/${id}/draft`)).body.draft.document as Protocol
    const library = (await api('/api/blocks')).body
    const rules = library.rules ?? (await api('/api/blocks/rules')).body.rules
    const { timeline } = analyze(doc, { library: library.blocks, rules })
    const at = (list: Interval[], t: number) => list.find(iv => iv.start <= t && t < iv.end)
    const near = (list: Interval[], t: number) => list.some(iv => Math.abs(iv.start - t) < 0.3 || Math.abs(iv.end - t) < 0.3)
    const body = timeline.tracks.find(t => t.kind === 'body')!.intervals
    const breath = timeline.tracks.find(t => t.kind === 'breath')!.intervals

    await page.locator('[data-pacer-play]').click()
    const pacer = page.locator('[data-studio-pacer]')
    let compared = 0
    const seen = new Set<string>()
    for (let i = 0; i < 60; i++) {
      const s = await pacer.evaluate(el => ({ ...(el as HTMLElement).dataset, circle: (el.querySelector('[data-breath-circle]') as HTMLElement).style.transform }))
      const t = Number(s.elapsed)
      if (t > 0 && !near(breath, t) && !near(body, t)) {
        // The guide is full while the breath is held in, smaller while breathing in or out.
        const size = Number(/scale\(([\d.]+)\)/.exec(s.circle!)?.[1])
        if (s.phase === 'hold-in') expect(size).toBe(1)
        if (s.phase === 'inhale' || s.phase === 'exhale') expect(size).toBeGreaterThanOrEqual(0.5)
        expect(s.phase, `breath phase at ${t} s`).toBe(at(breath, t)?.what ?? 'none')
        expect(s.body, `body interval at ${t} s`).toBe(at(body, t)?.what ?? 'none')
        expect(Number(s.set)).toBe(at(body, t)?.set ?? 0)
        compared++
        seen.add(s.phase!)
      }
      await page.waitForTimeout(70)
    }
    expect(compared).toBeGreaterThan(30)
    expect([...seen]).toEqual(expect.arrayContaining(['inhale', 'hold-in', 'exhale']))

    // Pause holds the clock still; skip jumps to the next interval.
    await page.locator('[data-pacer-pause]').click()
    const paused = await pacer.getAttribute('data-elapsed')
    await page.waitForTimeout(300)
    expect(await pacer.getAttribute('data-elapsed')).toBe(paused)
    const before = at(body, Number(paused))!
    await page.getByRole('button', { name: 'Skip' }).click()
    expect(Number(await pacer.getAttribute('data-elapsed'))).toBe(before.end)
    await page.screenshot({ path: artifact('studio-pacer-1280.png'), fullPage: true })

    // With reduced motion the circle stays still and a bar shows the phase instead.
    await page.emulateMedia({ reducedMotion: 'reduce' })
    await page.locator('[data-pacer-play]').click()
    await page.waitForTimeout(300)
    expect(await page.locator('[data-breath-circle]').evaluate(el => (el as HTMLElement).style.transform)).toBe('scale(0.8)')
    await page.emulateMedia({ reducedMotion: 'no-preference' })
  })

  it('shows another coach\'s draft read-only to a junior coach', async () => {
    const junior = await browser.newPage()
    await junior.goto(`${base()}/sign-in`)
    await junior.waitForSelector('[data-hydrated="true"]')
    // A second page shares the cookie jar, so this signs the whole browser in as the junior coach.
    await junior.evaluate(async (password) => {
      await fetch('/api/auth/sign-in', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'ada.junior@tidewell.example.test', password }) })
    }, PASSWORD)
    await junior.goto(`${base()}/studio/${mouseId}`)
    await junior.waitForSelector('[data-studio-state="ready"]')
    expect(await junior.locator('[data-read-only]').textContent()).toContain('Tobias Renk')
    expect(await junior.locator('[data-undo]').count()).toBe(0)
    expect(await junior.locator('[data-palette-block="wall-squat"]').isDisabled()).toBe(true)
    expect(await junior.locator('[data-save-status]').getAttribute('data-status')).toBe('read-only')
    // The analysis and the pacer still work for them.
    expect(await junior.locator('[data-metric="tensionSeconds"] dd').textContent()).toBe('8:00')
    await junior.close()
    await api('/api/auth/sign-in', { method: 'POST', body: { email: SENIOR, password: PASSWORD } })
  })

  it('looks finished at 1280 px and stays usable at 1024 and 768 px', async () => {
    await openStudio(mouseId)
    await bodyTrack().locator('.studio-block').first().click()
    for (const width of [1280, 1024, 768]) {
      await page.setViewportSize({ width, height: 900 })
      await page.waitForTimeout(200)
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow, `sideways scroll at ${width} px`).toBeLessThanOrEqual(0)
      await page.screenshot({ path: artifact(`studio-${width}.png`), fullPage: true })
    }
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.goto(`${base()}/studio`)
    await page.waitForSelector('[data-hydrated="true"]')
    await page.screenshot({ path: artifact('studio-index-1280.png'), fullPage: true })
  })
})

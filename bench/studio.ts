// The studio's speed in Chromium with a 300-block protocol: the time from a drop to the
// updated analysis panel (median of 20 drops), and the JavaScript the page downloads.
// Run: node --import jiti/register bench/studio.ts   (or `npm run bench -- studio`)
// It starts its own throwaway PostgreSQL and app server, like the integration tests.
// Diagnostics: BENCH_PROFILE=1 prints JavaScript self-time around the drops, BENCH_TRACE=1
// the browser's style/layout/paint work and style invalidations for the keyboard adds.
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../server/db/demo'
import type { BodyTrack, BreathTrack, Protocol } from '../shared/protocol/schema'
import { startStack } from '../tests/setup/stack'
// @ts-expect-error plain ESM helper shared with the start script
import { ROOT } from '../scripts/lib/setup.mjs'

// Loaded with Node's own require: jiti's transform cannot link playwright-core's bundle.
const { chromium } = createRequire(import.meta.url)('playwright-core') as typeof import('playwright-core')

const DROPS = 20
const TARGET_MS = 50
const TARGET_KB = 300

/** 300 blocks: 150 on the body track (4 × 60 s wall squats and seated rests), 150 breathing blocks (4-7-8 tied to each hold, slow breathing in the rests). */
function protocolOf(n: number): Protocol {
  const body: BodyTrack['blocks'] = []
  const breath: BreathTrack['blocks'] = []
  for (let i = 0; body.length + breath.length < n; i++) {
    body.push({ kind: 'hold', id: `h${i}`, block: 'wall-squat', sets: 4, hold: 60, rest: 60, target: { kneeAngle: 110, effort: 7 } })
    if (body.length + breath.length < n) breath.push({ kind: 'breath', id: `b${i}`, block: 'pattern-4-7-8', during: { id: `h${i}` } })
    if (body.length + breath.length < n) body.push({ kind: 'rest', id: `r${i}`, block: 'rest-seated', rest: 120 })
    if (body.length + breath.length < n) breath.push({ kind: 'breath', id: `s${i}`, block: 'pattern-slow-5-5', duration: 60 })
  }
  return { format: 1, name: `Bench ${n} blocks`, tracks: [{ id: 'body', kind: 'body', blocks: body }, { id: 'breath', kind: 'breath', blocks: breath }] }
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2
}

async function drag(page: Page, fromSel: string, toSel: string, beforeDrop?: () => Promise<void>) {
  const from = page.locator(fromSel)
  await from.scrollIntoViewIfNeeded()
  const a = (await from.boundingBox())!
  const b = (await page.locator(toSel).boundingBox())!
  const view = (await page.locator('[data-studio-canvas]').boundingBox())!
  // Aim inside the visible part of the scrolling track, among the existing blocks.
  const tx = Math.min(b.x + b.width - 40, view.x + view.width * 0.6)
  const [sx, sy, ty] = [a.x + a.width / 2, a.y + a.height / 2, b.y + b.height / 2]
  await page.mouse.move(sx, sy)
  await page.mouse.down()
  for (let i = 1; i <= 30; i++) {
    await page.mouse.move(sx + ((tx - sx) * i) / 30, sy + ((ty - sy) * i) / 30)
    await page.waitForTimeout(20)
  }
  await beforeDrop?.()
  await page.mouse.up()
}

async function main() {
  const runDir = mkdtempSync(join(tmpdir(), 'lamina-bench-'))
  const stack = await startStack({ dir: join(runDir, 'stack'), database: 'lamina_bench', mail: false, log: line => console.log(line) })
  const { baseUrl } = stack
  const chromiumPath = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
  if (!existsSync(chromiumPath)) throw new Error(`Chromium is not at ${chromiumPath}; apt-get install -y chromium`)
  const browser = await chromium.launchPersistentContext(join(runDir, 'chromium'), {
    executablePath: chromiumPath, headless: true, viewport: { width: 1280, height: 900 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  })
  try {
    const page = await browser.newPage()
    await page.goto(`${baseUrl}/sign-in`)
    const id = await page.evaluate(async ({ password, document }) => {
      const json = { 'content-type': 'application/json' }
      await fetch('/api/auth/sign-in', { method: 'POST', headers: json, body: JSON.stringify({ email: 'tobias.senior@tidewell.example.test', password }) })
      const res = await fetch('/api/templates', { method: 'POST', headers: json, body: JSON.stringify({ document }) })
      return (await res.json()).template.id as string
    }, { password: DEMO_PASSWORD, document: protocolOf(300) })

    // JavaScript: every script the studio page fetches on a cold load, gzipped as it would travel.
    const scripts = new Map<string, Buffer>()
    page.on('response', async (response) => {
      if (response.request().resourceType() === 'script') scripts.set(response.url(), await response.body().catch(() => Buffer.alloc(0)))
    })
    await page.goto(`${baseUrl}/studio/${id}`, { waitUntil: 'networkidle' })
    await page.waitForSelector('[data-studio-state="ready"]')
    await page.waitForLoadState('networkidle')
    const raw = [...scripts.values()].reduce((n, b) => n + b.length, 0)
    const gzip = [...scripts.values()].reduce((n, b) => n + gzipSync(b, { level: 9 }).length, 0)
    const blocks = await page.locator('.studio-block').count()

    // A drop starts at the browser's drop event; the panel counts as updated at the first
    // frame after its DOM changed.
    await page.evaluate(() => {
      const w = window as unknown as { __drops: number[], __dom: number[], __dropAt: number | null }
      w.__drops = []
      w.__dom = []
      w.__dropAt = null
      window.addEventListener('drop', () => { w.__dropAt = performance.now() }, true)
      const panel = document.querySelector('[data-studio-analysis]')!
      new MutationObserver(() => {
        const at = w.__dropAt
        if (at === null) return
        w.__dropAt = null
        w.__dom.push(performance.now() - at)
        // On screen: a message posted from the next animation frame runs once that frame's
        // style, layout and paint are done.
        const channel = new MessageChannel()
        channel.port1.onmessage = () => w.__drops.push(performance.now() - at)
        requestAnimationFrame(() => channel.port2.postMessage(null))
      }).observe(panel, { subtree: true, childList: true, characterData: true })
    })
    const self = new Map<string, number>()
    function collect(result: unknown) {
      const { profile } = result as { profile: { nodes: { id: number, callFrame: unknown }[], samples: number[], timeDeltas: number[] } }
      const byNode = new Map(profile.nodes.map(n => [n.id, n]))
      profile.samples.forEach((id, i) => {
        const f = byNode.get(id)!.callFrame as { functionName: string, url: string, lineNumber: number, columnNumber?: number }
        const key = `${f.functionName || '(anon)'} ${f.url.split('/').pop()}:${f.lineNumber}:${f.columnNumber}`
        self.set(key, (self.get(key) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000)
      })
    }
    // BENCH_PROFILE=1 prints where the main thread spent its time during the drops.
    const cdp = process.env.BENCH_PROFILE ? await page.context().newCDPSession(page) : null
    if (cdp) {
      await cdp.send('Profiler.enable')
      await cdp.send('Profiler.setSamplingInterval', { interval: 100 })
    }
    for (let i = 0; i < DROPS; i++) {
      await drag(page, '[data-palette-block="wall-squat"]', '[data-track-kind="body"] [data-track-list]', cdp ? () => cdp.send('Profiler.start').then(() => {}) : undefined)
      await page.waitForTimeout(250)
      if (cdp && i < DROPS - 1) await cdp.send('Profiler.stop').then(collect)
    }
    if (cdp) {
      await cdp.send('Profiler.stop').then(collect)
      console.log([...self].sort((a, b) => b[1] - a[1]).slice(0, 25).map(([k, v]) => `${v.toFixed(1).padStart(8)} ms  ${k}`).join('\n'))
    }
    const { drops, dom } = await page.evaluate(() => ({ drops: (window as unknown as { __drops: number[] }).__drops, dom: (window as unknown as { __dom: number[] }).__dom }))
    const after = await page.locator('[data-track-kind="body"] .studio-block').count()
    if (drops.length < DROPS) await page.screenshot({ path: join(ROOT, 'artifacts', 'bench-studio-failed.png') })
    if (drops.length < DROPS) throw new Error(`Only ${drops.length} of ${DROPS} drops updated the analysis panel (body blocks ${blocks} → ${after}).`)

    // The same change through the keyboard path (Enter on a palette block), timed from keydown.
    await page.evaluate(() => {
      const w = window as unknown as { __dropAt: number | null }
      window.addEventListener('keydown', () => { w.__dropAt = performance.now() }, true)
    })
    // BENCH_TRACE=1 sums the browser's rendering work (style, layout, paint) over these adds.
    const tracer = process.env.BENCH_TRACE ? await page.context().newCDPSession(page) : null
    const events: { name: string, dur?: number, ph: string, args?: { elementCount?: number, data?: unknown } }[] = []
    if (tracer) {
      tracer.on('Tracing.dataCollected', (e: { value: typeof events }) => void events.push(...e.value))
      await tracer.send('Tracing.start', { categories: 'devtools.timeline,disabled-by-default-devtools.timeline,disabled-by-default-devtools.timeline.invalidationTracking', transferMode: 'ReportEvents' })
    }
    for (let i = 0; i < 10; i++) {
      await page.locator('[data-palette-block="wall-squat"]').focus()
      await page.keyboard.press('Enter')
      await page.waitForTimeout(250)
    }
    if (tracer) {
      const done = new Promise(resolve => tracer.once('Tracing.tracingComplete', resolve))
      await tracer.send('Tracing.end')
      await done
      const sums = new Map<string, number>()
      for (const e of events) if (e.ph === 'X' && e.dur) sums.set(e.name, (sums.get(e.name) ?? 0) + e.dur / 1000)
      const styles = events.filter(e => e.name === 'UpdateLayoutTree' && e.dur)
      console.log('style recalcs:', styles.sort((a, b) => b.dur! - a.dur!).slice(0, 12).map(e => `${(e.dur! / 1000).toFixed(1)} ms / ${e.args?.elementCount ?? JSON.stringify(e.args).slice(0, 80)} elements`).join(', '))
      const reasons = new Map<string, number>()
      for (const e of events) {
        if (!e.name.includes('Invalidat')) continue
        const d = e.args?.data as { reason?: string, nodeName?: string, changedAttribute?: string, changedClass?: string } | undefined
        const key = `${e.name} ${d?.reason ?? ''} ${d?.nodeName ?? ''} ${d?.changedAttribute ?? ''} ${d?.changedClass ?? ''}`
        reasons.set(key, (reasons.get(key) ?? 0) + 1)
      }
      console.log([...reasons].sort((a, b) => b[1] - a[1]).slice(0, 20).map(([k, v]) => `${v}× ${k}`).join('\n'))
      console.log([...sums].sort((a, b) => b[1] - a[1]).slice(0, 15).map(([k, v]) => `${(v / 10).toFixed(1).padStart(8)} ms/add  ${k}`).join('\n'))
    }
    const keys = await page.evaluate(() => (window as unknown as { __drops: number[] }).__drops.slice(20))
    const ms = median(drops)
    console.log(`studio: ${blocks} blocks on the tracks, ${after} body blocks after ${DROPS} drops`)
    console.log(`studio: drop → analysis panel DOM updated, median of ${dom.length}: ${median(dom).toFixed(1)} ms (max ${Math.max(...dom).toFixed(1)} ms)`)
    console.log(`studio: drop → analysis panel updated on screen (after the next frame's paint), median of ${drops.length}: ${ms.toFixed(1)} ms (max ${Math.max(...drops).toFixed(1)} ms; target < ${TARGET_MS} ms) ${ms < TARGET_MS ? 'OK' : 'OVER'}`)
    console.log(`studio: keyboard add → analysis panel updated on screen, median of ${keys.length}: ${median(keys).toFixed(1)} ms`)
    console.log(`studio: JavaScript downloaded: ${scripts.size} files, ${(raw / 1024).toFixed(1)} KB raw, ${(gzip / 1024).toFixed(1)} KB gzip (target < ${TARGET_KB} KB) ${gzip / 1024 < TARGET_KB ? 'OK' : 'OVER'}`)
  }
  finally {
    await browser.close()
    await stack.stop()
    rmSync(runDir, { recursive: true, force: true })
  }
}

await main()

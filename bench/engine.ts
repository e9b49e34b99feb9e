// Speed of analyze() for protocols of 10, 100, 1,000 and 10,000 blocks.
// Run: node --import jiti/register bench/engine.ts
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { loadLibrary } from '../shared/library/load'
import { analyze } from '../shared/protocol/analyze'
import type { Protocol } from '../shared/protocol/schema'
import { ProtocolSchema } from '../shared/protocol/schema'

const root = fileURLToPath(new URL('..', import.meta.url))
const files = (dir: string) => readdirSync(join(root, dir)).filter(f => f.endsWith('.yaml')).map(f => ({ name: `${dir}/${f}`, text: readFileSync(join(root, dir, f), 'utf8') }))
const { blocks: library, rules } = loadLibrary({ blocks: files('blocks/library'), rules: files('blocks/rules') })

/**
 * A realistic session shape repeated to n blocks: half on the body track (holds of
 * 4 × 60 s with 60 s rests, then a 120 s seated rest), half on the breath track
 * (a 4-7-8 pattern tied to each hold, then 60 s of slow breathing in the rest).
 */
function protocolOf(n: number): Protocol {
  const body: unknown[] = []
  const breath: unknown[] = []
  for (let i = 0; body.length + breath.length < n; i++) {
    const hold = body.length
    body.push({ kind: 'hold', id: `h${i}`, block: 'wall-squat', sets: 4, hold: 60, rest: 60, target: { kneeAngle: 110, effort: 7 } })
    if (body.length + breath.length < n) breath.push({ kind: 'breath', id: `b${i}`, block: 'pattern-4-7-8', during: { track: 0, block: hold } })
    if (body.length + breath.length < n) body.push({ kind: 'rest', id: `r${i}`, block: 'rest-seated', rest: 120 })
    if (body.length + breath.length < n) breath.push({ kind: 'breath', id: `s${i}`, block: 'pattern-slow-5-5', duration: 60 })
  }
  return ProtocolSchema.parse({ format: 1, name: `Bench ${n}`, tracks: [{ kind: 'body', blocks: body }, { kind: 'breath', blocks: breath }] })
}

const profile = { readings: [{ systolic: 142, diastolic: 88 }], conditions: ['hypertension' as const], injuredRegions: ['shoulder' as const], medications: ['beta-blocker' as const] }

function measure(p: Protocol, runs: number): { median: number, p95: number, intervals: number, findings: number } {
  let last = analyze(p, { library, rules, profile, sessionsPerWeek: 3 })
  for (let i = 0; i < Math.min(20, runs); i++) last = analyze(p, { library, rules, profile, sessionsPerWeek: 3 }) // warm-up
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now()
    last = analyze(p, { library, rules, profile, sessionsPerWeek: 3 })
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  const intervals = last.timeline.tracks.reduce((a, t) => a + t.intervals.length, 0)
  return { median: times[Math.floor(times.length / 2)]!, p95: times[Math.floor(times.length * 0.95)]!, intervals, findings: last.findings.length }
}

const sizes = [10, 100, 1_000, 10_000]
const results = sizes.map(n => ({ n, ...measure(protocolOf(n), n >= 10_000 ? 60 : 200) }))
console.log('blocks    intervals   findings   median ms    p95 ms   ×time vs previous size')
let previous: number | undefined
for (const r of results) {
  const ratio = previous ? (r.median / previous).toFixed(2) : '—'
  console.log(`${String(r.n).padStart(6)} ${String(r.intervals).padStart(12)} ${String(r.findings).padStart(10)} ${r.median.toFixed(3).padStart(11)} ${r.p95.toFixed(3).padStart(9)}   ${ratio}`)
  previous = r.median
}
const at1000 = results.find(r => r.n === 1_000)!
console.log(`\n1,000 blocks: ${at1000.median.toFixed(2)} ms median (target < 5 ms). Growth 100→1,000 and 1,000→10,000: ${(at1000.median / results[1]!.median).toFixed(2)}× and ${(results[3]!.median / at1000.median).toFixed(2)}× (target ≤ 12×).`)

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { analyze } from '../../shared/protocol/analyze'
import type { Protocol } from '../../shared/protocol/schema'
import { ProtocolSchema } from '../../shared/protocol/schema'
import { parseProtocolYaml, protocolToYaml } from '../../shared/protocol/yaml'
import { anyProfile, someProtocol as anyProtocol } from './support/arbitraries'
import { repoLibrary } from './support/repo-library'

const { blocks: library, rules } = repoLibrary()
const RUNS = { numRuns: 400 }

/** Moves tracks to new positions and rewrites ties by position to follow them. */
function permuteTracks(p: Protocol, order: number[]): Protocol {
  const where = new Map(order.map((from, to) => [from, to]))
  const tracks = order.map(i => structuredClone(p.tracks[i]!))
  for (const t of tracks) {
    if (t.kind !== 'breath') continue
    for (const b of t.blocks) {
      if (b.during && 'track' in b.during) b.during = { ...b.during, track: where.get(b.during.track) ?? b.during.track + 100 }
    }
  }
  return { ...p, tracks: tracks as Protocol['tracks'] }
}

function hasDuplicateIds(p: Protocol): boolean {
  const seen = new Set<string>()
  for (const t of p.tracks) for (const b of t.blocks) {
    if (b.id === undefined) continue
    if (seen.has(b.id)) return true
    seen.add(b.id)
  }
  return false
}

describe('engine properties (fast-check)', () => {
  it('every generated document is one the schema accepts', () => {
    fc.assert(fc.property(anyProtocol, p => ProtocolSchema.safeParse(p).success), RUNS)
  })

  it('the validator never throws on a document the schema accepts, with or without a profile', () => {
    fc.assert(fc.property(anyProtocol, fc.option(anyProfile, { nil: undefined }), fc.option(fc.integer({ min: 1, max: 7 }), { nil: undefined }), (p, profile, perWeek) => {
      const result = analyze(p, { library, rules, profile, sessionsPerWeek: perWeek })
      for (const f of result.findings) {
        expect(typeof f.rule).toBe('string')
        expect(['error', 'warning', 'info']).toContain(f.severity)
        expect(f.caution.length).toBeGreaterThan(0)
      }
    }), RUNS)
  })

  it('the timeline never overlaps on one track and each interval has a positive length', () => {
    fc.assert(fc.property(anyProtocol, (p) => {
      const { timeline } = analyze(p, { library, rules })
      for (const track of timeline.tracks) {
        let end = 0
        for (const iv of track.intervals) {
          expect(iv.end).toBeGreaterThan(iv.start)
          expect(iv.start).toBeGreaterThanOrEqual(end)
          expect(Number.isInteger(iv.start) && Number.isInteger(iv.end)).toBe(true)
          end = iv.end
        }
        expect(track.end).toBe(track.intervals.at(-1)?.end ?? 0)
      }
    }), RUNS)
  })

  it('totals equal the sum of their parts: tension + rest fill each body track, breathing sums its phases', () => {
    fc.assert(fc.property(anyProtocol, (p) => {
      const { timeline, metrics } = analyze(p, { library, rules })
      let tension = 0
      let rest = 0
      let breath = 0
      for (const track of timeline.tracks) {
        let sum = 0
        for (const iv of track.intervals) {
          const len = iv.end - iv.start
          sum += len
          if (iv.what === 'set') tension += len
          else if (iv.what === 'rest') rest += len
          else breath += len
        }
        if (track.kind === 'body') expect(sum).toBe(track.end) // a body track has no gaps
      }
      expect(metrics.tensionSeconds).toBe(tension)
      expect(metrics.restSeconds).toBe(rest)
      expect(metrics.breathSeconds).toBe(breath)
      expect(metrics.sets.reduce((a, s) => a + s.holdSeconds, 0)).toBe(tension)
      expect(metrics.sessionSeconds).toBe(Math.max(0, ...timeline.tracks.map(t => t.end)))
      expect(metrics.retentionUnderTensionSeconds).toBeLessThanOrEqual(Math.min(metrics.retentionSeconds, tension))
    }), RUNS)
  })

  it('metrics do not change when independent tracks are reordered', () => {
    const withOrder = anyProtocol.filter(p => !hasDuplicateIds(p)).chain(p => fc.tuple(fc.constant(p), fc.shuffledSubarray([...p.tracks.keys()], { minLength: p.tracks.length, maxLength: p.tracks.length })))
    fc.assert(fc.property(withOrder, ([p, order]) => {
      const a = analyze(p, { library, rules, sessionsPerWeek: 3 }).metrics
      const b = analyze(permuteTracks(p, order), { library, rules, sessionsPerWeek: 3 }).metrics
      const { sets: setsA, ...restA } = a
      const { sets: setsB, ...restB } = b
      expect(restB).toEqual(restA)
      const key = (s: typeof setsA[number]) => `${s.start}|${s.end}|${s.retentionSeconds}|${s.breathCycles.whole}|${s.breathCycles.partial}|${s.restAfterSeconds}`
      expect(setsB.map(key).sort()).toEqual(setsA.map(key).sort())
    }), RUNS)
  })

  it('every document the exporter writes re-imports to the same document', () => {
    fc.assert(fc.property(anyProtocol, (p) => {
      const back = parseProtocolYaml(protocolToYaml(p))
      expect(back).toEqual({ ok: true, protocol: p })
    }), RUNS)
  })
})

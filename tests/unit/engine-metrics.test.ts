import { describe, expect, it } from 'vitest'
import { analyze } from '../../shared/protocol/analyze'
import { ProtocolSchema } from '../../shared/protocol/schema'
import type { Protocol } from '../../shared/protocol/schema'
import { repoLibrary } from './support/repo-library'

const { blocks: library, rules } = repoLibrary()

/** The commonly taught protocol: 4 × 120 s wall squat, 120 s rests, 4-7-8 breathing tied to the hold. */
const wallSquat: Protocol = ProtocolSchema.parse({
  format: 1,
  name: 'Wall squat with paced breath',
  tracks: [
    { kind: 'body', blocks: [{ kind: 'hold', id: 'squat', block: 'wall-squat', sets: 4, hold: 120, rest: 120, target: { kneeAngle: 110, effort: 7 } }] },
    { kind: 'breath', blocks: [{ kind: 'breath', id: 'breath', block: 'pattern-4-7-8', during: { track: 0, block: 0 } }] },
  ],
})

describe('session figures of the 4 × 2 min wall-squat protocol (arithmetic: common practice)', () => {
  const { metrics, findings, timeline } = analyze(wallSquat, { library, rules, sessionsPerWeek: 3 })

  it('has no findings without a client profile', () => {
    expect(findings).toEqual([])
  })

  it('lasts 840 s: 4 × 120 s holds and 3 × 120 s rests between them', () => {
    expect(metrics.sessionSeconds).toBe(840)
    expect(metrics.tensionSeconds).toBe(480)
    expect(metrics.restSeconds).toBe(360)
    expect(metrics.workRestRatio).toBe(1.33)
  })

  it('fits 6 whole 19 s breathing cycles and one partial cycle into each 120 s hold', () => {
    expect(metrics.sets).toHaveLength(4)
    for (const set of metrics.sets) expect(set.breathCycles).toEqual({ whole: 6, partial: 1 })
  })

  it('holds the breath 44 s inside each hold (6 × 7 s + 2 s cut off) and 176 s a session', () => {
    for (const set of metrics.sets) expect(set.retentionSeconds).toBe(44)
    expect(metrics.retentionUnderTensionSeconds).toBe(176)
    expect(metrics.longestRetentionUnderTensionSeconds).toBe(7)
  })

  it('breathes 3.16 times a minute (60 / 19 s)', () => {
    expect(metrics.breathsPerMinute).toBeCloseTo(3.16, 2)
  })

  it('gives 1440 s of time under tension and 2520 s of session time over 3 sessions a week', () => {
    expect(metrics.weeklyTensionSeconds).toBe(1440)
    expect(metrics.weeklySessionSeconds).toBe(2520)
  })

  it('cuts the last cycle of each hold at the hold\'s end: inhale 4 s, then 2 s of the 7 s hold', () => {
    const set1 = timeline.tracks[1]!.intervals.filter(i => i.set === 1)
    expect(set1.at(-2)).toMatchObject({ start: 114, end: 118, what: 'inhale', cycle: 7, partial: true })
    expect(set1.at(-1)).toMatchObject({ start: 118, end: 120, what: 'hold-in', cycle: 7, partial: true })
    const set2 = timeline.tracks[1]!.intervals.find(i => i.set === 2)
    expect(set2).toMatchObject({ start: 240, what: 'inhale', cycle: 1 }) // breathing restarts with the next set
  })

  it('lays the body track out as set, rest, set, rest, set, rest, set', () => {
    expect(timeline.tracks[0]!.intervals.map(i => [i.what, i.start, i.end])).toEqual([
      ['set', 0, 120], ['rest', 120, 240], ['set', 240, 360], ['rest', 360, 480], ['set', 480, 600], ['rest', 600, 720], ['set', 720, 840],
    ])
  })

  it('leaves weekly figures empty when no weekly frequency is given', () => {
    const { metrics } = analyze(wallSquat, { library, rules })
    expect(metrics.weeklyTensionSeconds).toBeNull()
    expect(metrics.weeklySessionSeconds).toBeNull()
  })
})

describe('other shapes of session', () => {
  it('counts a free-standing 10-minute slow-breathing practice as 60 cycles at 6 a minute (5 s in, 5 s out: common practice)', () => {
    const p = ProtocolSchema.parse({ format: 1, name: 'Daily breathing', tracks: [{ kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-slow-5-5', duration: 600 }] }] })
    const { metrics, findings } = analyze(p, { library, rules, sessionsPerWeek: 7 })
    expect(findings).toEqual([])
    expect(metrics.sessionSeconds).toBe(600)
    expect(metrics.breathCycles).toBe(60)
    expect(metrics.breathsPerMinute).toBe(6)
    expect(metrics.tensionSeconds).toBe(0)
    expect(metrics.workRestRatio).toBeNull()
    expect(metrics.weeklySessionSeconds).toBe(4200)
  })

  it('counts breath held under tension only where a free-standing pattern overlaps a hold', () => {
    // Hold 0–60 s; box breathing (16 s cycle, holds at 4–8 and 12–16) starts at 50 s and runs 32 s.
    const p = ProtocolSchema.parse({
      format: 1, name: 'Overlap', tracks: [
        { kind: 'body', blocks: [{ kind: 'hold', block: 'plank', sets: 1, hold: 60 }] },
        { kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-box-4', start: 50, duration: 32 }] },
      ],
    })
    const { metrics } = analyze(p, { library, rules })
    // Phases from 50 s: inhale 50–54, hold 54–58, exhale 58–62, hold 62–66, … Inside 0–60: the hold 54–58 only.
    expect(metrics.retentionSeconds).toBe(16)
    expect(metrics.retentionUnderTensionSeconds).toBe(4)
    expect(metrics.sessionSeconds).toBe(82)
  })

  it('gives the rest after the last set from a rest block that follows the hold', () => {
    const p = ProtocolSchema.parse({
      format: 1, name: 'Two holds', tracks: [{ kind: 'body', blocks: [
        { kind: 'hold', block: 'plank', sets: 2, hold: 30, rest: 60 },
        { kind: 'rest', block: 'rest-seated', rest: 90 },
        { kind: 'hold', block: 'glute-bridge-hold', sets: 1, hold: 45 },
      ] }],
    })
    const { metrics } = analyze(p, { library, rules })
    expect(metrics.sets.map(s => [s.restAfterSeconds, s.workRestRatio])).toEqual([[60, 0.5], [90, 0.33], [0, null]])
    expect(metrics.sessionSeconds).toBe(30 + 60 + 30 + 90 + 45)
  })
})

describe('interval codes', () => {
  it('metrics.ts uses the same codes as the timeline\'s INTERVAL_KINDS', async () => {
    const { INTERVAL_KINDS, SET, REST, HOLD_IN, HOLD_OUT } = await import('../../shared/protocol/timeline')
    expect([INTERVAL_KINDS[SET], INTERVAL_KINDS[REST], INTERVAL_KINDS[HOLD_IN], INTERVAL_KINDS[HOLD_OUT]]).toEqual(['set', 'rest', 'hold-in', 'hold-out'])
  })
})

import { describe, expect, it } from 'vitest'
import { analyze, hasErrors } from '../../shared/protocol/analyze'
import { STANDARD_CAUTION } from '../../shared/protocol/findings'
import type { Finding } from '../../shared/protocol/findings'
import type { ClientProfile } from '../../shared/protocol/profile'
import { ProtocolSchema } from '../../shared/protocol/schema'
import { repoLibrary } from './support/repo-library'

const { blocks: library, rules } = repoLibrary()

function run(doc: unknown, profile?: ClientProfile, sessionsPerWeek?: number): Finding[] {
  return analyze(ProtocolSchema.parse(doc), { library, rules, profile, sessionsPerWeek }).findings
}
const ids = (findings: Finding[]) => findings.map(f => f.rule)

const squat = (extra: object = {}) => ({ kind: 'hold', id: 'sq', block: 'wall-squat', sets: 4, hold: 120, rest: 120, target: { kneeAngle: 110, effort: 7 }, ...extra })
const doc = (body: object[], breath: object[] = [], extra: object = {}) => ({
  format: 1, name: 'Test', ...extra,
  tracks: [{ kind: 'body', blocks: body }, { kind: 'breath', blocks: breath }],
})
const tied478 = { kind: 'breath', id: 'br', block: 'pattern-4-7-8', during: { track: 0, block: 0 } }

describe('structural findings', () => {
  it('reports an empty protocol', () => {
    expect(ids(run({ format: 1, name: 'Empty', tracks: [] }))).toEqual(['structure.empty'])
  })

  it('reports a block that is not in the library, and one used as the wrong kind', () => {
    const findings = run(doc([squat({ block: 'moon-squat' }), { kind: 'rest', block: 'plank', rest: 60 }]))
    expect(findings.map(f => [f.rule, f.location.block])).toEqual([['structure.unknown-block', 0], ['structure.wrong-kind', 1]])
    expect(hasErrors(findings)).toBe(true)
  })

  it('reports zero and negative durations with the block\'s location and id', () => {
    const findings = run(doc([squat({ hold: 0 }), { kind: 'rest', id: 'r1', block: 'rest-seated', rest: -10 }]))
    expect(findings.filter(f => f.rule === 'structure.non-positive-duration').map(f => f.location)).toEqual([
      { track: 0, block: 0, blockId: 'sq' }, { track: 0, block: 1, blockId: 'r1' },
    ])
  })

  it('reports a breathing block tied to nothing, to a rest, or to a missing track', () => {
    for (const during of [{ track: 0, block: 5 }, { track: 1, block: 0 }, { track: 9, block: 0 }, { id: 'nope' }]) {
      expect(ids(run(doc([squat()], [{ kind: 'breath', block: 'pattern-slow-5-5', during }])))).toEqual(['structure.tie-missing'])
    }
    expect(ids(run(doc([{ kind: 'rest', id: 'r', block: 'rest-seated', rest: 60 }], [{ kind: 'breath', block: 'pattern-slow-5-5', during: { id: 'r' } }])))).toEqual(['structure.tie-missing'])
  })

  it('reports a breathing block with no length, or with two', () => {
    expect(ids(run(doc([squat()], [{ kind: 'breath', block: 'pattern-slow-5-5' }])))).toEqual(['structure.breath-length'])
    expect(ids(run(doc([squat()], [{ kind: 'breath', block: 'pattern-slow-5-5', duration: 60, cycles: 3 }])))).toEqual(['structure.breath-length'])
  })

  it('reports overlapping blocks on one track and leaves the later one off the timeline', () => {
    const result = analyze(ProtocolSchema.parse(doc([squat()], [
      { kind: 'breath', block: 'pattern-slow-5-5', start: 0, duration: 100 },
      { kind: 'breath', id: 'late', block: 'pattern-even-4-4', start: 50, duration: 20 },
    ])), { library, rules })
    expect(result.findings.map(f => [f.rule, f.location])).toEqual([['structure.overlap', { track: 1, block: 1, blockId: 'late' }]])
    expect(result.timeline.tracks[1]!.intervals.every(i => i.block === 0)).toBe(true)
  })

  it('reports two breathing blocks tied to the same hold on one track as an overlap', () => {
    expect(ids(run(doc([squat()], [tied478, { ...tied478, id: 'b2' }])))).toEqual(['structure.overlap'])
  })

  it('reports a block id used twice', () => {
    expect(ids(run(doc([squat(), squat()])))).toEqual(['structure.duplicate-id'])
  })

  it('ties a breathing block by the hold\'s id as well as by position', () => {
    const byId = analyze(ProtocolSchema.parse(doc([squat()], [{ kind: 'breath', block: 'pattern-4-7-8', during: { id: 'sq' } }])), { library, rules })
    expect(byId.findings).toEqual([])
    expect(byId.metrics.retentionUnderTensionSeconds).toBe(176)
  })
})

describe('timing findings (rules kept as data in blocks/rules)', () => {
  it('flags a hold longer than the block allows, with a fix that sets the maximum', () => {
    const [finding] = run(doc([squat({ hold: 240 })]))
    expect(finding).toMatchObject({ rule: 'timing.hold-above-range', severity: 'error', location: { track: 0, block: 0, blockId: 'sq' } })
    expect(finding!.message).toContain('240 s')
    expect(finding!.fix!.patch).toEqual([{ op: 'replace', path: '/tracks/0/blocks/0/hold', value: 180 }])
  })

  it('flags a hold shorter than the block allows', () => {
    expect(ids(run(doc([squat({ hold: 10 })])))).toContain('timing.hold-below-range')
  })

  it('flags a rest shorter than half the hold before it', () => {
    expect(ids(run(doc([squat({ rest: 45 })])))).toEqual(['timing.rest-share-short'])
    expect(ids(run(doc([squat({ sets: 1 }), { kind: 'rest', block: 'rest-seated', rest: 30 }])))).toEqual(['timing.rest-share-short'])
    expect(ids(run(doc([squat({ rest: 60 })])))).toEqual([])
  })

  it('flags time under tension outside the template\'s target, per session and per week', () => {
    const targets = { targets: { tensionSeconds: { min: 600 }, weeklyTensionSeconds: { max: 1200 } } }
    expect(ids(run(doc([squat()], [], targets), undefined, 3))).toEqual(['timing.session-tension-below-target', 'timing.weekly-tension-above-target'])
    expect(ids(run(doc([squat()], [], { targets: { tensionSeconds: { min: 400, max: 500 } } }), undefined, 3))).toEqual([])
  })
})

describe('contraindication findings against a client profile', () => {
  const crisis = { readings: [{ systolic: 186, diastolic: 96, takenAt: '2025-03-03T08:00:00+01:00' }] }

  it('makes a reading in the crisis range an error until clearance is recorded (Whelton et al., Hypertension 2018;71:e13–e115: above 180 and/or 120)', () => {
    const findings = run(doc([squat()]), crisis)
    expect(findings.map(f => [f.rule, f.severity])).toEqual([['bp.crisis-needs-clearance', 'error']])
    // 121 diastolic is also above the 110 exercise threshold, so both rules fire.
    expect(ids(run(doc([squat()]), { readings: [{ systolic: 150, diastolic: 121 }] })).sort()).toEqual(['bp.above-exercise-threshold', 'bp.crisis-needs-clearance'])
    expect(ids(run(doc([squat()]), { readings: [{ systolic: 180, diastolic: 105 }] }))).toEqual([]) // 180 is not above 180
  })

  it('lifts the crisis error once a clearance dated after the latest reading is recorded, not before', () => {
    expect(run(doc([squat()]), { ...crisis, clearance: { givenAt: '2025-03-04T10:00:00+01:00', by: 'Dr A. Example' } })).toEqual([])
    expect(ids(run(doc([squat()]), { ...crisis, clearance: { givenAt: '2025-03-01T10:00:00+01:00' } }))).toEqual(['bp.crisis-needs-clearance'])
  })

  it('makes resting values above 200 systolic or 110 diastolic an error (ACSM\'s Guidelines for Exercise Testing and Prescription)', () => {
    expect(ids(run(doc([squat()]), { readings: [{ systolic: 170, diastolic: 112 }] }))).toEqual(['bp.above-exercise-threshold'])
    expect(ids(run(doc([squat()]), { readings: [{ systolic: 201, diastolic: 90 }] })).sort()).toEqual(['bp.above-exercise-threshold', 'bp.crisis-needs-clearance'])
    expect(ids(run(doc([squat()]), { readings: [{ systolic: 170, diastolic: 110 }] }))).toEqual([])
  })

  it('warns about breath held inside a hold for a client with high blood pressure, and suggests a pattern without holds', () => {
    const findings = run(doc([squat()], [tied478]), { conditions: ['hypertension'] })
    expect(findings).toHaveLength(1)
    expect(findings[0]).toMatchObject({ rule: 'breath.retention-under-load', severity: 'warning', location: { track: 1, block: 0, blockId: 'br' } })
    expect(findings[0]!.message).toContain('176 s')
    expect(findings[0]!.fix!.patch).toEqual([{ op: 'replace', path: '/tracks/1/blocks/0/block', value: 'pattern-exhale-4-6' }])
    // The same from readings alone (stage 2 by ACC/AHA), and for heart disease.
    expect(ids(run(doc([squat()], [tied478]), { readings: [{ systolic: 150, diastolic: 95 }] }))).toEqual(['breath.retention-under-load'])
    expect(ids(run(doc([squat()], [tied478]), { conditions: ['heart-disease'] }))).toEqual(['breath.retention-under-load'])
  })

  it('does not warn about breath holds for a pattern without them, or for a client without high blood pressure', () => {
    expect(run(doc([squat()], [{ ...tied478, block: 'pattern-exhale-4-6' }]), { conditions: ['hypertension'] })).toEqual([])
    expect(run(doc([squat()], [tied478]), { readings: [{ systolic: 118, diastolic: 76 }] })).toEqual([])
  })

  it('applying the suggested fix removes the warning', () => {
    const original = doc([squat()], [{ ...tied478, pattern: { inhale: 4, holdIn: 7, exhale: 8 } }])
    const [finding] = run(original, { conditions: ['hypertension'] })
    const fixed = structuredClone(original) as { tracks: Array<{ blocks: Array<Record<string, unknown>> }> }
    for (const op of finding!.fix!.patch!) {
      const [, , t, , b, key] = op.path.split('/')
      if (op.op === 'remove') delete fixed.tracks[Number(t)]!.blocks[Number(b)]![key!]
      else fixed.tracks[Number(t)]!.blocks[Number(b)]![key!] = op.value
    }
    expect(run(fixed, { conditions: ['hypertension'] })).toEqual([])
  })

  it('flags heart-rate-based intensity as unreliable on beta-blockers and suggests the effort rating', () => {
    const findings = run(doc([squat({ target: { kneeAngle: 110 } })]), { medications: ['beta-blocker'] })
    expect(findings.map(f => f.rule)).toEqual(['intensity.heart-rate-on-beta-blocker'])
    expect(findings[0]!.fix!.patch).toEqual([{ op: 'add', path: '/tracks/0/blocks/0/target/effort', value: 6 }])
    expect(ids(run(doc([squat({ target: { heartRate: 120, effort: 6 } })]), { medications: ['beta-blocker'] }))).toEqual(['intensity.heart-rate-on-beta-blocker'])
    expect(run(doc([squat()]), { medications: ['beta-blocker'] })).toEqual([]) // graded by effort already
  })

  it('flags a hold that loads an injured body region', () => {
    const findings = run(doc([squat(), { kind: 'rest', block: 'rest-seated', rest: 120 }, { kind: 'hold', block: 'wall-push-up-hold', sets: 2, hold: 30, rest: 30 }]), { injuredRegions: ['knee'] })
    expect(findings.map(f => [f.rule, f.location.block])).toEqual([['injury.loads-injured-region', 0]])
    expect(findings[0]!.message).toContain('knee')
  })

  it('flags a block tagged for extra care with a condition on the client\'s record', () => {
    expect(ids(run(doc([{ kind: 'hold', block: 'plank', sets: 2, hold: 30, rest: 30 }]), { conditions: ['pregnancy'] }))).toEqual(['condition.block-flagged'])
  })

  it('shows the usual caution with every finding and defers to medical advice and local codes', () => {
    const findings = run(doc([squat({ hold: 999 })], [tied478]), { ...crisis, conditions: ['hypertension'], injuredRegions: ['knee'] })
    expect(findings.length).toBeGreaterThanOrEqual(4)
    for (const f of findings) {
      expect(f.caution).toContain(STANDARD_CAUTION)
      expect(f.caution).toMatch(/does not replace, medical advice and licensed practice/)
      expect(f.caution).toMatch(/local codes/)
    }
    for (const f of findings.filter(f => f.rule.startsWith('bp.') || f.rule.startsWith('breath.'))) expect(f.source).toBeTruthy()
  })
})

import { describe, expect, it } from 'vitest'
import { analyzeJsonRequest, analyzeYamlRequest, assessReadings, wallSquatRequest } from '../../shared/engine/requests'
import { repoLibrary } from './support/repo-library'

const library = repoLibrary()
const protocol = {
  format: 1, name: 'Wall squat', tracks: [
    { kind: 'body', blocks: [{ kind: 'hold', block: 'wall-squat', sets: 4, hold: 120, rest: 120, target: { kneeAngle: 110, effort: 7 } }] },
    { kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-4-7-8', during: { track: 0, block: 0 } }] },
  ],
}
const yaml = `format: 1
name: Wall squat
tracks:
  - kind: body
    blocks:
      - { kind: hold, block: wall-squat, sets: 4, hold: 120, rest: 120 }
`

describe('POST /api/analyze (request handling)', () => {
  it('returns timeline, metrics and findings for a JSON protocol, with the named metrics', () => {
    const out = analyzeJsonRequest({ protocol, sessionsPerWeek: 3, profile: { conditions: ['hypertension'] } }, library)
    expect(out.ok).toBe(true)
    if (!out.ok) return
    expect(out.value.metrics).toMatchObject({
      sessionSeconds: 840, tensionSeconds: 480, restSeconds: 360, workRestRatio: 1.33, breathsPerMinute: 3.16,
      retentionUnderTensionSeconds: 176, longestRetentionUnderTensionSeconds: 7, weeklyTensionSeconds: 1440, weeklySessionSeconds: 2520,
    })
    expect(out.value.findings.map(f => f.rule)).toEqual(['breath.retention-under-load'])
    expect(out.value.findings[0]).toHaveProperty('fix')
  })

  it('accepts the protocol as YAML text in the protocol field', () => {
    const out = analyzeJsonRequest({ protocol: yaml }, library)
    expect(out.ok && out.value.metrics.sessionSeconds).toBe(840)
  })

  it('accepts a YAML body with sessionsPerWeek in the query', () => {
    const out = analyzeYamlRequest(yaml, { sessionsPerWeek: '3' }, library)
    expect(out.ok && out.value.metrics.weeklyTensionSeconds).toBe(1440)
  })

  it('lists every problem by path at once: bad protocol fields, bad profile, bad frequency', () => {
    const bad = structuredClone(protocol) as typeof protocol & { tracks: Array<{ blocks: Array<Record<string, unknown>> }> }
    bad.tracks[0]!.blocks[0]!.hold = 'long'
    bad.tracks[0]!.blocks[0]!.sets = 2.5
    const out = analyzeJsonRequest({ protocol: bad, profile: { conditions: ['flu'] }, sessionsPerWeek: 0, extra: 1 }, library)
    expect(out.ok).toBe(false)
    if (out.ok) return
    const paths = out.issues.map(i => i.path)
    expect(paths).toEqual(expect.arrayContaining(['body.protocol.tracks.0.blocks.0.hold', 'body.protocol.tracks.0.blocks.0.sets', 'body.profile.conditions.0', 'body.sessionsPerWeek', 'body']))
    for (const issue of out.issues) expect(issue.message.length).toBeGreaterThan(0)
  })

  it('names the missing protocol, and YAML problems with their line', () => {
    const missing = analyzeJsonRequest({}, library)
    expect(missing).toMatchObject({ ok: false, issues: [{ path: 'body.protocol' }] })
    const broken = analyzeYamlRequest(yaml.replace('sets: 4', 'sets: x'), {}, library)
    expect(broken).toMatchObject({ ok: false, issues: [{ path: 'body.tracks.0.blocks.0.sets', message: expect.stringMatching(/^line 6: /) }] })
    expect(analyzeJsonRequest(null, library)).toMatchObject({ ok: false })
    expect(analyzeJsonRequest('not an object', library)).toMatchObject({ ok: false })
  })

  it('refuses a protocol that would expand past the server\'s interval budget with a 400-style issue', () => {
    const huge = { format: 1, name: 'Huge', tracks: [{ kind: 'breath', blocks: Array.from({ length: 20 }, () => ({ kind: 'breath', pattern: { inhale: 1, exhale: 1 }, duration: 86_400 })) }] }
    expect(analyzeJsonRequest({ protocol: huge }, library)).toMatchObject({ ok: false, issues: [{ path: 'body.protocol', message: expect.stringMatching(/200000/) }] })
  })
})

describe('POST /api/bp/assess (request handling)', () => {
  it('classifies each reading and the average; MAP and pulse pressure as in Whelton et al., Hypertension 2018;71:e13–e115', () => {
    const out = assessReadings({ readings: [{ systolic: 120, diastolic: 80, pulse: 70 }, { systolic: 140, diastolic: 90 }] })
    expect(out.ok).toBe(true)
    if (!out.ok) return
    expect(out.value.readings[0]).toMatchObject({ category: 'stage-1', meanArterialPressure: 93.3, pulsePressure: 40, ratePressureProduct: 8400 })
    expect(out.value.readings[1]).toMatchObject({ category: 'stage-2', ratePressureProduct: null })
    expect(out.value.average).toMatchObject({ systolic: 130, diastolic: 85, category: 'stage-1' })
    expect(out.value.home).toMatchObject({ status: 'not-enough-readings' })
  })

  it('uses the ESH 2023 grades when asked (Mancia et al., J Hypertens 2023;41:1874)', () => {
    const out = assessReadings({ readings: [{ systolic: 135, diastolic: 85 }], guideline: 'esh-2023' })
    expect(out.ok && out.value.readings[0]!.category).toBe('high-normal')
  })

  it('lists every bad reading by path', () => {
    const out = assessReadings({ readings: [{ systolic: 'high', diastolic: 80 }, { systolic: 80, diastolic: 120 }, { systolic: 120 }], guideline: 'who' })
    expect(out.ok).toBe(false)
    if (out.ok) return
    expect(out.issues.map(i => i.path)).toEqual(expect.arrayContaining(['body.readings.0.systolic', 'body.readings.1.systolic', 'body.readings.2.diastolic', 'body.guideline']))
    expect(assessReadings({ readings: [] })).toMatchObject({ ok: false, issues: [{ path: 'body.readings' }] })
  })
})

describe('POST /api/intensity/wall-squat (request handling)', () => {
  it('returns kneeAngle, targetHeartRate and r', () => {
    const out = wallSquatRequest({ stages: [{ kneeAngle: 130, heartRate: 100 }, { kneeAngle: 120, heartRate: 112 }, { kneeAngle: 110, heartRate: 118 }], peakHeartRate: 130, targetShare: 0.95 })
    expect(out).toMatchObject({ ok: true, value: { kneeAngle: 105, targetHeartRate: 123.5, r: -0.982 } })
  })

  it('refuses fewer than 3 stages and flat data with a message under body.stages', () => {
    expect(wallSquatRequest({ stages: [{ kneeAngle: 130, heartRate: 100 }], peakHeartRate: 130, targetShare: 0.95 }))
      .toMatchObject({ ok: false, issues: [{ path: 'body.stages', message: 'A fit needs at least 3 stages.' }] })
    expect(wallSquatRequest({ stages: [1, 2, 3].map(() => ({ kneeAngle: 120, heartRate: 100 })), peakHeartRate: 130, targetShare: 0.95 }))
      .toMatchObject({ ok: false, issues: [{ path: 'body.stages' }] })
  })

  it('lists every bad field', () => {
    const out = wallSquatRequest({ stages: 'none', peakHeartRate: 20, targetShare: 2 })
    expect(out.ok ? [] : out.issues.map(i => i.path).sort()).toEqual(['body.peakHeartRate', 'body.stages', 'body.targetShare'])
  })
})

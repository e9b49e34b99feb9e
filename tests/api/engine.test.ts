import { afterAll, describe, expect, it } from 'vitest'
import { Client, closeTestDb, signedIn } from './support/accounts'

// The engine over HTTP, as another tool of a practice would call it.
const DEMO_COACH = 'tobias.senior@tidewell.example.test'
const DEMO_PASSWORD = 'lamina-demo-2026'

const reference = {
  format: 1,
  name: 'Wall squat, 4 × 2 min, paced 4-7-8',
  tracks: [
    { kind: 'body', blocks: [{ kind: 'hold', id: 'squat', block: 'wall-squat', sets: 4, hold: 120, rest: 120 }] },
    { kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-4-7-8', during: { id: 'squat' } }] },
  ],
}

afterAll(closeTestDb)

describe('engine over HTTP', () => {
  it('answers 401 to a caller who is not signed in', async () => {
    const reply = await new Client().post('/api/analyze', { protocol: reference })
    expect(reply.status).toBe(401)
  })

  it('analyzes the 4 × 2 min wall squat with 4-7-8 breathing into the figures a coach expects', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    const reply = await coach.post('/api/analyze', { protocol: reference, sessionsPerWeek: 3 })
    expect(reply.status).toBe(200)
    // Common practice arithmetic: 4 × 120 s holds, 3 × 120 s rests, a 19 s cycle with 7 s held.
    expect(reply.body.metrics).toMatchObject({
      sessionSeconds: 840,
      tensionSeconds: 480,
      restSeconds: 360,
      retentionUnderTensionSeconds: 176,
      longestRetentionUnderTensionSeconds: 7,
      weeklyTensionSeconds: 1440,
    })
    expect(reply.body.metrics.breathsPerMinute).toBeCloseTo(3.16, 2)
    expect(Array.isArray(reply.body.findings)).toBe(true)
    expect(reply.body.timeline).toBeTruthy()
  })

  it('takes a YAML protocol and names the line of a YAML mistake', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    const yaml = 'format: 1\nname: Plank\ntracks:\n  - kind: body\n    blocks:\n      - { kind: hold, block: plank, sets: 3, hold: 30, rest: 60 }\n'
    const ok = await coach.request('POST', '/api/analyze?sessionsPerWeek=2', yaml, { 'content-type': 'application/yaml' })
    expect(ok.status).toBe(200)
    expect(ok.body.metrics.tensionSeconds).toBe(90)
    expect(ok.body.metrics.weeklyTensionSeconds).toBe(180)

    const broken = await coach.request('POST', '/api/analyze', 'format: 1\nname: [unclosed\n', { 'content-type': 'application/yaml' })
    expect(broken.status).toBe(400)
    expect(JSON.stringify(broken.body.data.issues)).toMatch(/line/i)
  })

  it('lists every problem of a bad document by path, never a 500', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    const reply = await coach.post('/api/analyze', { protocol: { format: 2, name: '', tracks: 'none' }, sessionsPerWeek: 'often' })
    expect(reply.status).toBe(400)
    const paths = reply.body.data.issues.map((i: { path: string }) => i.path)
    expect(paths.some((p: string) => p.startsWith('body.protocol'))).toBe(true)
    expect(paths.some((p: string) => p.startsWith('body.sessionsPerWeek'))).toBe(true)
    const notJson = await coach.request('POST', '/api/analyze', '{"protocol": ', { 'content-type': 'application/json' })
    expect(notJson.status).toBe(400)
  })

  it('classifies readings by the 2017 ACC/AHA guideline (Whelton et al., Hypertension 2018;71:e13–e115)', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    const reply = await coach.post('/api/bp/assess', { readings: [
      { systolic: 118, diastolic: 76 },
      { systolic: 124, diastolic: 82 },
      { systolic: 182, diastolic: 100, pulse: 70 },
    ] })
    expect(reply.status).toBe(200)
    expect(reply.body.readings.map((r: { category: string }) => r.category)).toEqual(['normal', 'stage-1', 'crisis'])
    // Rate-pressure product = heart rate × systolic pressure (common practice): 70 × 182.
    expect(reply.body.readings[2].ratePressureProduct).toBe(12740)
    expect(reply.body.home.status).toBe('not-enough-readings')
    const bad = await coach.post('/api/bp/assess', { readings: [{ systolic: 'high' }] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toMatch(/^body\.readings\.0/)
  })

  it('finds the wall-squat angle from a hand-worked incremental test and refuses two stages', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    // Worked by hand: heart rate falls 1 bpm per degree, HR = 230 − angle; 95 % of 140 = 133 bpm → 97°.
    const stages = [135, 125, 115, 105].map(kneeAngle => ({ kneeAngle, heartRate: 230 - kneeAngle }))
    const reply = await coach.post('/api/intensity/wall-squat', { stages, peakHeartRate: 140, targetShare: 0.95 })
    expect(reply.status).toBe(200)
    expect(reply.body.targetHeartRate).toBeCloseTo(133, 5)
    expect(reply.body.kneeAngle).toBeCloseTo(97, 5)
    expect(reply.body.r).toBeCloseTo(-1, 5)
    const two = await coach.post('/api/intensity/wall-squat', { stages: stages.slice(0, 2), peakHeartRate: 140, targetShare: 0.95 })
    expect(two.status).toBe(400)
    expect(JSON.stringify(two.body.data.issues)).toMatch(/body\.stages/)
  })

  it('serves the validated block library and rules to members', async () => {
    const coach = await signedIn(DEMO_COACH, DEMO_PASSWORD)
    const reply = await coach.get('/api/blocks')
    expect(reply.status).toBe(200)
    expect(reply.body.blocks.length).toBeGreaterThanOrEqual(15)
    expect(new Set(reply.body.blocks.map((b: { kind: string }) => b.kind))).toEqual(new Set(['hold', 'breath', 'rest']))
    expect(reply.body.rules.length).toBeGreaterThan(0)
  })
})

import { describe, expect, it } from 'vitest'
import { EFFORT_ANCHORS, effortAnchor, handgripTarget, IntensityError, mvcPercent, wallSquatAngle } from '../../shared/intensity'

describe('wall-squat depth from an incremental test (least-squares line of heart rate on knee angle)', () => {
  it('solves a hand-worked example: 3 stages, r = −0.982, angle 105° for 95 % of 130 bpm', () => {
    // Worked by hand: angles 130/120/110°, heart rates 100/112/118 bpm.
    // Means 120° and 110 bpm; Sxy = −180, Sxx = 200, Syy = 168 → slope −0.9, intercept 218.
    // r = −180 / √(200 × 168) = −0.98198. Target 0.95 × 130 = 123.5 bpm → angle (123.5 − 218) / −0.9 = 105°.
    const result = wallSquatAngle({ stages: [{ kneeAngle: 130, heartRate: 100 }, { kneeAngle: 120, heartRate: 112 }, { kneeAngle: 110, heartRate: 118 }], peakHeartRate: 130, targetShare: 0.95 })
    expect(result.slope).toBeCloseTo(-0.9, 10)
    expect(result.intercept).toBeCloseTo(218, 10)
    expect(result.r).toBe(-0.982)
    expect(result.targetHeartRate).toBe(123.5)
    expect(result.kneeAngle).toBe(105)
    expect(result.extrapolated).toBe(true) // 105° is deeper than the deepest stage tested (110°)
  })

  it('solves a 5-stage test with heart rate exactly 235 − angle: 95 % of 150 bpm is at 92.5°, r = −1', () => {
    // Worked by hand: 135→100, 125→110, 115→120, 105→130, 95→140 lie on HR = 235 − angle.
    const stages = [135, 125, 115, 105, 95].map(a => ({ kneeAngle: a, heartRate: 235 - a }))
    const result = wallSquatAngle({ stages, peakHeartRate: 150, targetShare: 0.95 })
    expect(result.kneeAngle).toBe(92.5)
    expect(result.targetHeartRate).toBe(142.5)
    expect(result.r).toBe(-1)
  })

  it('refuses a fit from fewer than 3 stages', () => {
    expect(() => wallSquatAngle({ stages: [{ kneeAngle: 130, heartRate: 100 }, { kneeAngle: 120, heartRate: 110 }], peakHeartRate: 150, targetShare: 0.95 }))
      .toThrow(IntensityError)
    expect(() => wallSquatAngle({ stages: [], peakHeartRate: 150, targetShare: 0.95 })).toThrow(/at least 3 stages/)
  })

  it('refuses stages that all share one knee angle or one heart rate', () => {
    expect(() => wallSquatAngle({ stages: [1, 2, 3].map(() => ({ kneeAngle: 120, heartRate: 100 })), peakHeartRate: 150, targetShare: 0.95 })).toThrow(IntensityError)
    expect(() => wallSquatAngle({ stages: [130, 120, 110].map(a => ({ kneeAngle: a, heartRate: 100 })), peakHeartRate: 150, targetShare: 0.95 })).toThrow(IntensityError)
  })
})

describe('handgrip target force', () => {
  it('is 30 % of a 40 kg maximal grip: 12 kg (arithmetic, common practice)', () => {
    expect(handgripTarget(40, 0.3)).toBe(12)
    expect(mvcPercent(12, 40)).toBe(30)
  })
  it('refuses a share outside 0–1 and a non-positive grip', () => {
    expect(() => handgripTarget(40, 1.5)).toThrow(RangeError)
    expect(() => handgripTarget(0, 0.3)).toThrow(RangeError)
  })
})

describe('effort rating 0–10 in Lamina\'s own words', () => {
  it('has one anchor for each of 0 to 10', () => {
    expect(EFFORT_ANCHORS).toHaveLength(11)
    expect(effortAnchor(0)).toMatch(/no effort/)
    expect(effortAnchor(10)).toMatch(/one second longer/)
    expect(effortAnchor(7.5)).toBe(EFFORT_ANCHORS[7])
    expect(() => effortAnchor(11)).toThrow(RangeError)
  })
  it('does not use the wording of a licensed perceived-exertion scale', () => {
    // Anchor phrases of proprietary category-ratio scales, listed from memory, must not appear.
    const licensed = [/nothing at all/i, /very,? very (weak|light)/i, /extremely (weak|strong)/i, /^maximal$/i, /very (weak|strong|light|hard)/i, /somewhat (hard|strong)/i, /^(weak|strong|moderate|hard|light)$/i]
    for (const anchor of EFFORT_ANCHORS) for (const pattern of licensed) expect(anchor).not.toMatch(pattern)
  })
})

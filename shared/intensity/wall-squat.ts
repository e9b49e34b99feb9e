// Wall-squat depth from an incremental test: 2-minute stages at decreasing knee angles
// with heart rate per stage. A least-squares line of heart rate on knee angle is solved
// for the angle whose heart rate is the target share of peak heart rate.

export interface Stage { kneeAngle: number, heartRate: number }

export interface WallSquatInput {
  stages: readonly Stage[]
  peakHeartRate: number
  /** Share of peak heart rate to aim for, 0–1 (published protocols use 0.95). */
  targetShare: number
}

export interface WallSquatResult {
  /** Knee angle in degrees, to 0.1°. */
  kneeAngle: number
  /** Target heart rate in bpm, to 0.1. */
  targetHeartRate: number
  /** Pearson correlation of heart rate with knee angle, to 3 decimals. */
  r: number
  slope: number
  intercept: number
  /** True when the angle lies outside the tested angles (the line is extended). */
  extrapolated: boolean
}

/** Fewest stages a fit is made from. */
export const MIN_STAGES = 3

/** Raised when the test data cannot give an angle; `field` names what to fix. */
export class IntensityError extends Error {
  readonly field: string
  constructor(field: string, message: string) {
    super(message)
    this.name = 'IntensityError'
    this.field = field
  }
}

/** Solves the incremental test for the knee angle at the target heart rate. */
export function wallSquatAngle(input: WallSquatInput): WallSquatResult {
  const { stages, peakHeartRate, targetShare } = input
  if (stages.length < MIN_STAGES) throw new IntensityError('stages', `A fit needs at least ${MIN_STAGES} stages; ${stages.length} given.`)
  const n = stages.length
  let mx = 0
  let my = 0
  for (const s of stages) {
    mx += s.kneeAngle
    my += s.heartRate
  }
  mx /= n
  my /= n
  let sxx = 0
  let sxy = 0
  let syy = 0
  for (const s of stages) {
    const dx = s.kneeAngle - mx
    const dy = s.heartRate - my
    sxx += dx * dx
    sxy += dx * dy
    syy += dy * dy
  }
  if (sxx === 0) throw new IntensityError('stages', 'The stages need at least two different knee angles.')
  if (sxy === 0 || syy === 0) throw new IntensityError('stages', 'Heart rate did not change with knee angle, so no angle can be found for the target.')
  const slope = sxy / sxx
  const intercept = my - slope * mx
  const target = peakHeartRate * targetShare
  const angle = (target - intercept) / slope
  let lo = Infinity
  let hi = -Infinity
  for (const s of stages) {
    lo = Math.min(lo, s.kneeAngle)
    hi = Math.max(hi, s.kneeAngle)
  }
  return {
    kneeAngle: Math.round(angle * 10) / 10,
    targetHeartRate: Math.round(target * 10) / 10,
    r: Math.round(sxy / Math.sqrt(sxx * syy) * 1000) / 1000,
    slope,
    intercept,
    extrapolated: angle < lo || angle > hi,
  }
}

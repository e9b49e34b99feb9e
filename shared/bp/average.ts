import type { Guideline } from '../protocol/vocabulary'
import type { BpCategory } from './classify'
import { classify, meanArterialPressure, pulsePressure } from './classify'

/** A reading as the averaging functions need it. */
export interface BpReading { systolic: number, diastolic: number, pulse?: number, takenAt?: string }

export interface BpSummary {
  systolic: number
  diastolic: number
  pulse: number | null
  count: number
  category: BpCategory
  meanArterialPressure: number
  pulsePressure: number
}

const round1 = (x: number) => Math.round(x * 10) / 10

/** Summarises readings already chosen for averaging (values to 0.1 mmHg). */
export function summarise(readings: readonly BpReading[], guideline?: Guideline): BpSummary | null {
  if (readings.length === 0) return null
  let s = 0
  let d = 0
  let p = 0
  let pn = 0
  for (const r of readings) {
    s += r.systolic
    d += r.diastolic
    if (r.pulse !== undefined) {
      p += r.pulse
      pn++
    }
  }
  const systolic = round1(s / readings.length)
  const diastolic = round1(d / readings.length)
  return {
    systolic,
    diastolic,
    pulse: pn ? round1(p / pn) : null,
    count: readings.length,
    category: classify(systolic, diastolic, guideline),
    meanArterialPressure: meanArterialPressure(systolic, diastolic),
    pulsePressure: round1(pulsePressure(systolic, diastolic)),
  }
}

/** Fewest readings left after discarding day 1 before a home average is reported. */
export const HOME_MIN_READINGS = 12
/** Length of a home-monitoring series in days. */
export const HOME_DAYS = 7

export type HomeAverage =
  | ({ status: 'ok', days: number, discarded: number } & BpSummary)
  | { status: 'not-enough-readings', count: number, needed: number, message: string }

/** The calendar day a reading was taken, as written in its own offset (the client's local day). */
function localDay(takenAt: string): string {
  return takenAt.slice(0, 10)
}

function dayNumber(day: string): number {
  return Math.floor(Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10))) / 86_400_000)
}

/**
 * Home-monitoring average: the series is the 7 calendar days ending on the latest
 * reading's day; every reading of the series' first day is discarded and the rest
 * averaged. Fewer than 12 readings left gives "not enough readings".
 */
export function homeAverage(readings: readonly BpReading[], guideline?: Guideline): HomeAverage {
  const dated = readings.filter((r): r is BpReading & { takenAt: string } => typeof r.takenAt === 'string')
  const notEnough = (count: number, message: string): HomeAverage =>
    ({ status: 'not-enough-readings', count, needed: HOME_MIN_READINGS, message })
  if (dated.length === 0) return notEnough(0, 'A home average needs dated readings.')
  let last = -Infinity
  for (const r of dated) last = Math.max(last, dayNumber(localDay(r.takenAt)))
  const inSeries = dated.filter(r => dayNumber(localDay(r.takenAt)) > last - HOME_DAYS)
  let first = Infinity
  for (const r of inSeries) first = Math.min(first, dayNumber(localDay(r.takenAt)))
  const kept = inSeries.filter(r => dayNumber(localDay(r.takenAt)) !== first)
  if (kept.length < HOME_MIN_READINGS) {
    return notEnough(kept.length, `Not enough readings: ${kept.length} after the first day is set aside; a home average needs at least ${HOME_MIN_READINGS}.`)
  }
  const days = new Set(kept.map(r => localDay(r.takenAt))).size
  return { status: 'ok', days, discarded: inSeries.length - kept.length, ...summarise(kept, guideline)! }
}

/** The latest reading: by takenAt when every reading has one, else the last listed. */
export function latestReading<R extends BpReading>(readings: readonly R[]): R | undefined {
  if (readings.length === 0) return undefined
  if (readings.every(r => r.takenAt)) {
    let best = readings[0]!
    for (const r of readings) if (Date.parse(r.takenAt!) >= Date.parse(best.takenAt!)) best = r
    return best
  }
  return readings[readings.length - 1]
}

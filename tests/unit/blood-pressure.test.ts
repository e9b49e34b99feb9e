import { describe, expect, it } from 'vitest'
import { classifyAccAha, classifyEsh, homeAverage, meanArterialPressure, pulsePressure, ratePressureProduct, summarise } from '../../shared/bp'
import type { BpReading } from '../../shared/bp'

// ACC/AHA: Whelton et al., 2017 ACC/AHA guideline, Hypertension 2018;71:e13–e115.
describe('blood-pressure category by the 2017 ACC/AHA guideline (Whelton et al., Hypertension 2018;71:e13–e115)', () => {
  it.each([
    [118, 76, 'normal'],
    [119, 79, 'normal'],
    [120, 79, 'elevated'], // systolic 120–129 with diastolic < 80
    [124, 78, 'elevated'],
    [129, 79, 'elevated'],
    [130, 79, 'stage-1'], // systolic 130–139
    [139, 79, 'stage-1'],
    [119, 80, 'stage-1'], // or diastolic 80–89
    [124, 82, 'stage-1'], // the higher of the two categories wins
    [119, 89, 'stage-1'],
    [140, 70, 'stage-2'], // systolic ≥ 140
    [119, 90, 'stage-2'], // or diastolic ≥ 90
    [138, 92, 'stage-2'],
    [180, 120, 'stage-2'], // crisis begins above 180 and/or above 120
    [181, 80, 'crisis'],
    [150, 121, 'crisis'],
    [182, 100, 'crisis'],
  ] as const)('%i/%i mmHg is %s', (s, d, expected) => {
    expect(classifyAccAha(s, d)).toBe(expected)
  })
})

// ESH 2023: Mancia et al., 2023 ESH Guidelines, J Hypertens 2023;41:1874–2071.
describe('blood-pressure grade by the 2023 ESH guidelines (Mancia et al., J Hypertens 2023;41:1874)', () => {
  it.each([
    [119, 79, 'optimal'],
    [120, 79, 'normal'], [129, 84, 'normal'], [119, 80, 'normal'],
    [130, 84, 'high-normal'], [139, 89, 'high-normal'], [125, 85, 'high-normal'],
    [140, 89, 'grade-1'], [159, 99, 'grade-1'], [135, 90, 'grade-1'],
    [160, 99, 'grade-2'], [179, 109, 'grade-2'], [150, 100, 'grade-2'],
    [180, 109, 'grade-3'], [170, 110, 'grade-3'],
  ] as const)('%i/%i mmHg is %s', (s, d, expected) => {
    expect(classifyEsh(s, d).grade).toBe(expected)
  })

  it('flags isolated systolic (≥ 140 and < 90) and isolated diastolic (< 140 and ≥ 90) hypertension', () => {
    expect(classifyEsh(150, 85).isolated).toBe('systolic')
    expect(classifyEsh(135, 92).isolated).toBe('diastolic')
    expect(classifyEsh(150, 95).isolated).toBeNull()
    expect(classifyEsh(139, 89).isolated).toBeNull()
  })
})

describe('derived pressures (standard physiology formulas)', () => {
  it('mean arterial pressure of 120/80 is 93.3 mmHg (diastolic + pulse pressure / 3)', () => {
    expect(meanArterialPressure(120, 80)).toBe(93.3)
  })
  it('pulse pressure of 120/80 is 40 mmHg and of 150/70 is 80 mmHg', () => {
    expect(pulsePressure(120, 80)).toBe(40)
    expect(pulsePressure(150, 70)).toBe(80)
  })
  it('rate-pressure product of 70 bpm at 120 mmHg is 8,400', () => {
    expect(ratePressureProduct(70, 120)).toBe(8400)
  })
  it('averages readings and classifies the average (132/86 from 130/85 and 134/87 is stage 1 by ACC/AHA)', () => {
    const summary = summarise([{ systolic: 130, diastolic: 85 }, { systolic: 134, diastolic: 87 }])
    expect(summary).toMatchObject({ systolic: 132, diastolic: 86, category: 'stage-1', meanArterialPressure: 101.3, pulsePressure: 46 })
  })
})

/** Readings for consecutive days from 2025-03-03, two sessions a day, two readings a session. */
function series(days: number, day1: BpReading, rest: BpReading[]): BpReading[] {
  const out: BpReading[] = []
  for (let d = 0; d < days; d++) {
    for (const time of ['07:00', '07:02', '19:00', '19:02']) {
      const base = d === 0 ? day1 : rest[out.length % rest.length]!
      out.push({ ...base, takenAt: `2025-03-${String(3 + d).padStart(2, '0')}T${time}:00+01:00` })
    }
  }
  return out
}

// Parati et al., 2021 ESH position paper on home blood pressure monitoring, J Hypertens 2021;39:1742–1767.
describe('home-monitoring average (ESH 2021, Parati et al., J Hypertens 2021;39:1742)', () => {
  it('averages 24 of 28 readings: 7 days × 2 sessions × 2 readings with day 1 discarded', () => {
    const readings = series(7, { systolic: 170, diastolic: 105 }, [{ systolic: 130, diastolic: 85 }, { systolic: 134, diastolic: 87 }])
    expect(readings).toHaveLength(28)
    const home = homeAverage(readings)
    expect(home).toMatchObject({ status: 'ok', count: 24, discarded: 4, days: 6, systolic: 132, diastolic: 86, category: 'stage-1' })
  })

  it('reports an average from exactly 12 readings left after day 1', () => {
    const readings = series(4, { systolic: 170, diastolic: 105 }, [{ systolic: 120, diastolic: 78 }])
    expect(homeAverage(readings)).toMatchObject({ status: 'ok', count: 12, systolic: 120, diastolic: 78 })
  })

  it('says "not enough readings" with 11 readings left after day 1', () => {
    const readings = series(4, { systolic: 170, diastolic: 105 }, [{ systolic: 120, diastolic: 78 }]).slice(0, 15)
    const home = homeAverage(readings)
    expect(home.status).toBe('not-enough-readings')
    expect(home).toMatchObject({ count: 11, needed: 12 })
  })

  it('uses only the 7 days ending on the latest reading', () => {
    const old = series(3, { systolic: 200, diastolic: 110 }, [{ systolic: 200, diastolic: 110 }]).map(r => ({ ...r, takenAt: r.takenAt!.replace('2025-03', '2025-01') }))
    const recent = series(7, { systolic: 170, diastolic: 105 }, [{ systolic: 130, diastolic: 85 }])
    expect(homeAverage([...old, ...recent])).toMatchObject({ status: 'ok', count: 24, systolic: 130 })
  })

  it('needs dated readings', () => {
    expect(homeAverage([{ systolic: 120, diastolic: 80 }]).status).toBe('not-enough-readings')
  })
})

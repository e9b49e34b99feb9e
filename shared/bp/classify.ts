import type { Guideline } from '../protocol/vocabulary'

// Blood-pressure arithmetic. Thresholds are written as "below N" so that averages
// with decimals fall on the same side as the guidelines' whole-number bands.

/** ACC/AHA 2017 categories, mildest first. */
export const ACC_AHA_CATEGORIES = ['normal', 'elevated', 'stage-1', 'stage-2', 'crisis'] as const
export type AccAhaCategory = typeof ACC_AHA_CATEGORIES[number]

/** ESH 2023 grades, mildest first. */
export const ESH_GRADES = ['optimal', 'normal', 'high-normal', 'grade-1', 'grade-2', 'grade-3'] as const
export type EshGrade = typeof ESH_GRADES[number]

export type BpCategory = AccAhaCategory | EshGrade

const LABELS: Record<BpCategory, string> = {
  'normal': 'Normal',
  'elevated': 'Elevated',
  'stage-1': 'Stage 1 hypertension',
  'stage-2': 'Stage 2 hypertension',
  'crisis': 'Crisis range (above 180 and/or 120)',
  'optimal': 'Optimal',
  'high-normal': 'High normal',
  'grade-1': 'Grade 1 hypertension',
  'grade-2': 'Grade 2 hypertension',
  'grade-3': 'Grade 3 hypertension',
}

/** Plain label for a category or grade. */
export function categoryLabel(category: BpCategory): string {
  return LABELS[category]
}

function accAhaSystolic(s: number): number {
  if (s > 180) return 4
  if (s >= 140) return 3
  if (s >= 130) return 2
  if (s >= 120) return 1
  return 0
}

function accAhaDiastolic(d: number): number {
  if (d > 120) return 4
  if (d >= 90) return 3
  if (d >= 80) return 2
  return 0 // diastolic alone never makes a reading "elevated"
}

/** ACC/AHA 2017 category; a reading takes the higher of its systolic and diastolic categories. */
export function classifyAccAha(systolic: number, diastolic: number): AccAhaCategory {
  return ACC_AHA_CATEGORIES[Math.max(accAhaSystolic(systolic), accAhaDiastolic(diastolic))]!
}

function eshSystolic(s: number): number {
  if (s >= 180) return 5
  if (s >= 160) return 4
  if (s >= 140) return 3
  if (s >= 130) return 2
  if (s >= 120) return 1
  return 0
}

function eshDiastolic(d: number): number {
  if (d >= 110) return 5
  if (d >= 100) return 4
  if (d >= 90) return 3
  if (d >= 85) return 2
  if (d >= 80) return 1
  return 0
}

export interface EshResult {
  grade: EshGrade
  /** Isolated systolic (≥140 and <90) or isolated diastolic (<140 and ≥90) hypertension. */
  isolated: 'systolic' | 'diastolic' | null
}

/** ESH 2023 grade (the higher of systolic and diastolic), with isolated forms flagged. */
export function classifyEsh(systolic: number, diastolic: number): EshResult {
  const grade = ESH_GRADES[Math.max(eshSystolic(systolic), eshDiastolic(diastolic))]!
  const isolated = systolic >= 140 && diastolic < 90 ? 'systolic' : systolic < 140 && diastolic >= 90 ? 'diastolic' : null
  return { grade, isolated }
}

/** Category under the practice's guideline (ACC/AHA 2017 unless told otherwise). */
export function classify(systolic: number, diastolic: number, guideline: Guideline = 'acc-aha-2017'): BpCategory {
  return guideline === 'esh-2023' ? classifyEsh(systolic, diastolic).grade : classifyAccAha(systolic, diastolic)
}

/** True when the category is hypertension of any stage or grade. */
export function isHypertensive(category: BpCategory): boolean {
  return category === 'stage-1' || category === 'stage-2' || category === 'crisis'
    || category === 'grade-1' || category === 'grade-2' || category === 'grade-3'
}

/** Mean arterial pressure, diastolic + one third of pulse pressure, to 0.1 mmHg. */
export function meanArterialPressure(systolic: number, diastolic: number): number {
  return Math.round((diastolic + (systolic - diastolic) / 3) * 10) / 10
}

/** Pulse pressure, systolic minus diastolic, mmHg. */
export function pulsePressure(systolic: number, diastolic: number): number {
  return systolic - diastolic
}

/** Rate-pressure product, heart rate × systolic (bpm × mmHg). */
export function ratePressureProduct(heartRate: number, systolic: number): number {
  return heartRate * systolic
}

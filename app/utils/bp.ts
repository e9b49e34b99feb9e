import type { assessReadings } from '#shared/engine/requests'

/** What POST /api/bp/assess answers (the shared assessment, as JSON). */
export type BpAssessment = Extract<ReturnType<typeof assessReadings>, { ok: true }>['value']

/** One reading as typed into the form (text until it is sent). */
export interface ReadingRow { key: number, systolic: string, diastolic: string, pulse: string, takenAt: string }

/** A `datetime-local` value as an ISO date-time with this device's offset, so the day stays the client's own. */
export function localDateTimeToIso(value: string): string | undefined {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(value)) return undefined
  const offset = -new Date(value).getTimezoneOffset()
  const sign = offset >= 0 ? '+' : '-'
  const abs = Math.abs(offset)
  const pad = (n: number) => String(n).padStart(2, '0')
  return `${value.slice(0, 16)}:00${sign}${pad(Math.floor(abs / 60))}:${pad(abs % 60)}`
}

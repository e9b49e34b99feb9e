import { z } from 'zod'
import { homeAverage, summarise } from '../bp/average'
import { categoryLabel, classify, meanArterialPressure, pulsePressure, ratePressureProduct } from '../bp/classify'
import type { BpCategory } from '../bp/classify'
import { IntensityError, wallSquatAngle } from '../intensity/wall-squat'
import type { Library } from '../library/types'
import type { Analysis } from '../protocol/analyze'
import { analyze } from '../protocol/analyze'
import { ClientProfileSchema, ReadingSchema } from '../protocol/profile'
import type { Protocol } from '../protocol/schema'
import { checkProtocol, formatProtocolIssue, parseProtocolYaml } from '../protocol/yaml'
import { GUIDELINES } from '../protocol/vocabulary'

// Request schemas and pure handlers of the engine's HTTP endpoints. The route files only
// read the body and turn `issues` into a 400; everything here is testable without a server.

/** One problem with a request, by dotted path under `body` (or `query`). */
export interface RequestIssue { path: string, message: string }
export type Outcome<T> = { ok: true, value: T } | { ok: false, issues: RequestIssue[] }

/** Interval budget for a protocol analysed over HTTP (a real session is a few thousand). */
export const HTTP_MAX_INTERVALS = 200_000

const issuesFrom = (error: z.ZodError, root: string): RequestIssue[] =>
  error.issues.map(i => ({ path: [root, ...i.path.map(String)].join('.'), message: i.message }))

export const SessionsPerWeekSchema = z.int().min(1).max(14)

export const AnalyzeBodySchema = z.strictObject({
  protocol: z.unknown().refine(v => v !== undefined, 'A protocol is required: a document object or its YAML text.'),
  profile: ClientProfileSchema.optional(),
  sessionsPerWeek: SessionsPerWeekSchema.optional(),
})

export const AnalyzeQuerySchema = z.object({
  sessionsPerWeek: z.coerce.number().pipe(SessionsPerWeekSchema).optional(),
})

function protocolFrom(value: unknown, root: string): Outcome<Protocol> {
  const parsed = typeof value === 'string' ? parseProtocolYaml(value) : checkProtocol(value)
  if (parsed.ok) return { ok: true, value: parsed.protocol }
  return {
    ok: false,
    issues: parsed.issues.map(i => ({
      path: i.path ? `${root}.${i.path}` : root,
      message: i.line ? formatProtocolIssue({ ...i, path: '' }) : i.message,
    })),
  }
}

function run(protocol: Protocol, library: Library, root: string, profile?: z.infer<typeof ClientProfileSchema>, sessionsPerWeek?: number): Outcome<Analysis> {
  const result = analyze(protocol, { library: library.blocks, rules: library.rules, profile, sessionsPerWeek, limits: { maxIntervals: HTTP_MAX_INTERVALS } })
  if (result.timeline.truncated) {
    return { ok: false, issues: [{ path: root, message: `The protocol expands to more than ${HTTP_MAX_INTERVALS} timeline intervals; shorten it.` }] }
  }
  return { ok: true, value: result }
}

/** POST /api/analyze with a JSON body `{ protocol, profile?, sessionsPerWeek? }`; protocol may be YAML text. */
export function analyzeJsonRequest(body: unknown, library: Library): Outcome<Analysis> {
  const envelope = AnalyzeBodySchema.safeParse(body ?? {})
  const issues: RequestIssue[] = envelope.success ? [] : issuesFrom(envelope.error, 'body')
  const raw = body !== null && typeof body === 'object' ? (body as { protocol?: unknown }).protocol : undefined
  const protocol = raw === undefined ? undefined : protocolFrom(raw, 'body.protocol')
  if (protocol && !protocol.ok) issues.push(...protocol.issues)
  if (issues.length || !envelope.success || !protocol?.ok) return { ok: false, issues }
  return run(protocol.value, library, 'body.protocol', envelope.data.profile, envelope.data.sessionsPerWeek)
}

/** POST /api/analyze with a YAML body (the protocol alone); sessionsPerWeek may come in the query. */
export function analyzeYamlRequest(text: string, query: unknown, library: Library): Outcome<Analysis> {
  const q = AnalyzeQuerySchema.safeParse(query ?? {})
  const issues: RequestIssue[] = q.success ? [] : issuesFrom(q.error, 'query')
  const protocol = protocolFrom(text, 'body')
  if (!protocol.ok) issues.push(...protocol.issues)
  if (issues.length || !q.success || !protocol.ok) return { ok: false, issues }
  return run(protocol.value, library, 'body', undefined, q.data.sessionsPerWeek)
}

export const BpAssessBodySchema = z.strictObject({
  readings: z.array(ReadingSchema).min(1, 'Send at least one reading.').max(1000),
  guideline: z.enum(GUIDELINES).optional(),
})

interface AssessedReading {
  systolic: number
  diastolic: number
  pulse: number | null
  takenAt: string | null
  category: BpCategory
  label: string
  meanArterialPressure: number
  pulsePressure: number
  ratePressureProduct: number | null
}

/** POST /api/bp/assess: category, MAP and pulse pressure of each reading, of the average, and the home average. */
export function assessReadings(body: unknown) {
  const parsed = BpAssessBodySchema.safeParse(body ?? {})
  if (!parsed.success) return { ok: false as const, issues: issuesFrom(parsed.error, 'body') }
  const { readings, guideline = 'acc-aha-2017' } = parsed.data
  const each: AssessedReading[] = readings.map((r) => {
    const category = classify(r.systolic, r.diastolic, guideline)
    return {
      systolic: r.systolic,
      diastolic: r.diastolic,
      pulse: r.pulse ?? null,
      takenAt: r.takenAt ?? null,
      category,
      label: categoryLabel(category),
      meanArterialPressure: meanArterialPressure(r.systolic, r.diastolic),
      pulsePressure: pulsePressure(r.systolic, r.diastolic),
      ratePressureProduct: r.pulse === undefined ? null : ratePressureProduct(r.pulse, r.systolic),
    }
  })
  const average = summarise(readings, guideline)!
  const home = homeAverage(readings, guideline)
  return {
    ok: true as const,
    value: {
      guideline,
      readings: each,
      average: { ...average, label: categoryLabel(average.category) },
      home: home.status === 'ok' ? { ...home, label: categoryLabel(home.category) } : home,
    },
  }
}

export const WallSquatBodySchema = z.strictObject({
  stages: z.array(z.strictObject({
    kneeAngle: z.number().min(30).max(180),
    heartRate: z.number().min(30).max(250),
  })).min(3, 'A fit needs at least 3 stages.').max(20),
  peakHeartRate: z.number().min(60).max(250),
  targetShare: z.number().gt(0).max(1),
})

/** POST /api/intensity/wall-squat: the knee angle for the target share of peak heart rate. */
export function wallSquatRequest(body: unknown) {
  const parsed = WallSquatBodySchema.safeParse(body ?? {})
  if (!parsed.success) return { ok: false as const, issues: issuesFrom(parsed.error, 'body') }
  try {
    const { kneeAngle, targetHeartRate, r, extrapolated } = wallSquatAngle(parsed.data)
    return { ok: true as const, value: { kneeAngle, targetHeartRate, r, extrapolated } }
  }
  catch (error) {
    if (error instanceof IntensityError) return { ok: false as const, issues: [{ path: `body.${error.field}`, message: error.message }] }
    throw error
  }
}

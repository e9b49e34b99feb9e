import { z } from 'zod'
import { BODY_REGIONS, CONDITIONS, GUIDELINES, MEDICATIONS } from './vocabulary'

/** An ISO 8601 date-time with an offset or Z, e.g. 2025-03-04T07:30:00+01:00. */
export const DateTimeSchema = z.iso.datetime({ offset: true })

/** One blood-pressure reading in mmHg (pulse in beats per minute). */
export const ReadingSchema = z.strictObject({
  systolic: z.int().min(50).max(320),
  diastolic: z.int().min(20).max(220),
  pulse: z.int().min(20).max(250).optional(),
  takenAt: DateTimeSchema.optional(),
}).refine(r => r.systolic > r.diastolic, { message: 'Systolic must be higher than diastolic.', path: ['systolic'] })

/** What the engine knows about a client when checking a protocol for them. */
export const ClientProfileSchema = z.strictObject({
  readings: z.array(ReadingSchema).max(1000).optional(),
  conditions: z.array(z.enum(CONDITIONS)).max(CONDITIONS.length).optional(),
  injuredRegions: z.array(z.enum(BODY_REGIONS)).max(BODY_REGIONS.length).optional(),
  medications: z.array(z.enum(MEDICATIONS)).max(MEDICATIONS.length).optional(),
  clearance: z.strictObject({ givenAt: DateTimeSchema, by: z.string().max(200).optional() }).nullable().optional(),
  guideline: z.enum(GUIDELINES).optional(),
})

export type Reading = z.infer<typeof ReadingSchema>
export type ClientProfile = z.infer<typeof ClientProfileSchema>

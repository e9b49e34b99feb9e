import { z } from 'zod'

// The protocol document, format 1. Durations are whole seconds. Counts and durations
// accept any integer in a wide band so that a half-edited block (0 s, -5 s) still
// parses and the validator can point at it; the engine treats anything ≤ 0 as an error.
// protocol.schema.json is the same contract for ajv; a unit test keeps them in step.

/** Longest value any duration field accepts, in seconds (24 h). */
export const MAX_SECONDS = 86_400
/** Most tracks a protocol may have. */
export const MAX_TRACKS = 32
/** Most blocks one track may hold. */
export const MAX_BLOCKS_PER_TRACK = 10_000

const Seconds = z.int().min(-MAX_SECONDS).max(MAX_SECONDS)
const Count = z.int().min(-10_000).max(10_000)
const Text = (max: number) => z.string().max(max)

/** A library block id: lower-case words joined by hyphens. */
export const LibraryIdSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,63}$/, 'Use lower-case letters, digits and hyphens (up to 64).')
/** A block's own stable key inside a document (the studio uses nanoid-style ids). */
export const BlockIdSchema = z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, 'Use letters, digits, "_" or "-" (up to 64).')

const Cues = z.array(Text(200)).max(20)

export const TargetSchema = z.strictObject({
  kneeAngle: z.int().min(0).max(180).optional(),
  mvcPercent: z.int().min(0).max(100).optional(),
  effort: z.int().min(0).max(10).optional(),
  heartRate: z.int().min(30).max(250).optional(),
})

export const HoldBlockSchema = z.strictObject({
  kind: z.literal('hold'),
  id: BlockIdSchema.optional(),
  block: LibraryIdSchema,
  sets: Count,
  hold: Seconds,
  rest: Seconds.optional(),
  target: TargetSchema.optional(),
  cues: Cues.optional(),
  notes: Text(2000).optional(),
})

export const RestBlockSchema = z.strictObject({
  kind: z.literal('rest'),
  id: BlockIdSchema.optional(),
  block: LibraryIdSchema,
  rest: Seconds,
  cues: Cues.optional(),
  notes: Text(2000).optional(),
})

export const PatternSchema = z.strictObject({
  inhale: Seconds.optional(),
  holdIn: Seconds.optional(),
  exhale: Seconds.optional(),
  holdOut: Seconds.optional(),
})

export const TieByIndexSchema = z.strictObject({
  track: z.int().min(0).max(MAX_TRACKS),
  block: z.int().min(0).max(MAX_BLOCKS_PER_TRACK),
})
export const TieByIdSchema = z.strictObject({ id: BlockIdSchema })

export const BreathBlockSchema = z.strictObject({
  kind: z.literal('breath'),
  id: BlockIdSchema.optional(),
  block: LibraryIdSchema.optional(),
  pattern: PatternSchema.optional(),
  duration: Seconds.optional(),
  cycles: Count.optional(),
  during: z.union([TieByIndexSchema, TieByIdSchema]).optional(),
  start: Seconds.optional(),
  cues: Cues.optional(),
  notes: Text(2000).optional(),
})

export const BodyTrackSchema = z.strictObject({
  id: BlockIdSchema.optional(),
  kind: z.literal('body'),
  label: Text(100).optional(),
  blocks: z.array(z.discriminatedUnion('kind', [HoldBlockSchema, RestBlockSchema])).max(MAX_BLOCKS_PER_TRACK),
})

export const BreathTrackSchema = z.strictObject({
  id: BlockIdSchema.optional(),
  kind: z.literal('breath'),
  label: Text(100).optional(),
  blocks: z.array(BreathBlockSchema).max(MAX_BLOCKS_PER_TRACK),
})

const Range = z.strictObject({ min: Seconds.optional(), max: Seconds.optional() })

export const ProtocolSchema = z.strictObject({
  format: z.literal(1),
  name: z.string().min(1).max(200),
  notes: Text(5000).optional(),
  targets: z.strictObject({
    tensionSeconds: Range.optional(),
    weeklyTensionSeconds: z.strictObject({ min: z.int().min(0).max(10 * MAX_SECONDS).optional(), max: z.int().min(0).max(10 * MAX_SECONDS).optional() }).optional(),
  }).optional(),
  tracks: z.array(z.discriminatedUnion('kind', [BodyTrackSchema, BreathTrackSchema])).max(MAX_TRACKS),
})

export type Protocol = z.infer<typeof ProtocolSchema>
export type Track = Protocol['tracks'][number]
export type BodyTrack = z.infer<typeof BodyTrackSchema>
export type BreathTrack = z.infer<typeof BreathTrackSchema>
export type HoldBlock = z.infer<typeof HoldBlockSchema>
export type RestBlock = z.infer<typeof RestBlockSchema>
export type BreathBlock = z.infer<typeof BreathBlockSchema>
export type ProtocolBlock = HoldBlock | RestBlock | BreathBlock
export type Pattern = z.infer<typeof PatternSchema>
export type Target = z.infer<typeof TargetSchema>

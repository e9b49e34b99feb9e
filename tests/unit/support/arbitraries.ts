import fc from 'fast-check'
import type { Protocol } from '../../../shared/protocol/schema'

// Generators of schema-valid protocol documents, deliberately including broken ones
// (unknown blocks, zero and negative durations, dangling ties, overlaps).

const HOLDS = ['wall-squat', 'handgrip-hold', 'plank', 'split-squat-hold', 'not-a-block']
const RESTS = ['rest-seated', 'rest-walking', 'wall-squat']
const BREATHS = ['pattern-4-7-8', 'pattern-box-4', 'pattern-slow-5-5', 'pattern-exhale-4-6', 'no-such-pattern']

const seconds = fc.oneof({ weight: 6, arbitrary: fc.integer({ min: 1, max: 200 }) }, { weight: 1, arbitrary: fc.integer({ min: -5, max: 0 }) })
const phase = fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 9 }), fc.constant(-1))
const id = fc.stringMatching(/^[A-Za-z0-9_-]{1,8}$/)
const text = (max: number) => fc.string({ maxLength: max, unit: 'binary' })

/** Omits keys whose value is undefined, as a document read from JSON or YAML would. */
function clean<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T
}

const hold = fc.record({
  kind: fc.constant('hold' as const),
  id: fc.option(id, { nil: undefined }),
  block: fc.constantFrom(...HOLDS),
  sets: fc.integer({ min: -1, max: 5 }),
  hold: seconds,
  rest: fc.option(fc.integer({ min: -2, max: 150 }), { nil: undefined }),
  target: fc.option(fc.record({ kneeAngle: fc.integer({ min: 80, max: 150 }), effort: fc.integer({ min: 0, max: 10 }) }, { requiredKeys: [] }), { nil: undefined }),
  cues: fc.option(fc.array(text(20), { maxLength: 2 }), { nil: undefined }),
  notes: fc.option(text(30), { nil: undefined }),
}).map(clean)

const rest = fc.record({
  kind: fc.constant('rest' as const),
  id: fc.option(id, { nil: undefined }),
  block: fc.constantFrom(...RESTS),
  rest: seconds,
}).map(clean)

const breath = fc.record({
  kind: fc.constant('breath' as const),
  id: fc.option(id, { nil: undefined }),
  block: fc.option(fc.constantFrom(...BREATHS), { nil: undefined }),
  pattern: fc.option(fc.record({ inhale: phase, holdIn: phase, exhale: phase, holdOut: phase }, { requiredKeys: [] }), { nil: undefined }),
  length: fc.oneof(
    { weight: 3, arbitrary: fc.record({ during: fc.record({ track: fc.integer({ min: 0, max: 3 }), block: fc.integer({ min: 0, max: 4 }) }) }) },
    { weight: 1, arbitrary: fc.record({ during: fc.record({ id }) }) },
    { weight: 2, arbitrary: fc.record({ duration: seconds }) },
    { weight: 1, arbitrary: fc.record({ cycles: fc.integer({ min: -1, max: 6 }) }) },
    { weight: 1, arbitrary: fc.constant({}) },
  ),
  start: fc.option(fc.integer({ min: -3, max: 900 }), { nil: undefined }),
}).map(({ length, ...b }) => clean({ ...b, ...length }))

const track = fc.oneof(
  fc.record({ kind: fc.constant('body' as const), blocks: fc.array(fc.oneof({ weight: 3, arbitrary: hold }, { weight: 1, arbitrary: rest }), { maxLength: 5 }) }),
  fc.record({ kind: fc.constant('breath' as const), label: fc.option(text(10), { nil: undefined }), blocks: fc.array(breath, { maxLength: 5 }) }).map(clean),
)

/** Any schema-valid document, broken or not. */
export const anyProtocol: fc.Arbitrary<Protocol> = fc.record({
  format: fc.constant(1 as const),
  name: fc.string({ minLength: 1, maxLength: 20, unit: 'binary' }),
  notes: fc.option(text(40), { nil: undefined }),
  targets: fc.option(fc.record({ tensionSeconds: fc.record({ min: fc.integer({ min: 0, max: 600 }), max: fc.integer({ min: 0, max: 900 }) }, { requiredKeys: [] }) }, { requiredKeys: [] }), { nil: undefined }),
  tracks: fc.array(track, { maxLength: 4 }),
}).map(p => clean(p) as Protocol)

/** A client profile with any mix of readings, conditions, injuries, medications and clearance. */
export const anyProfile = fc.record({
  readings: fc.array(fc.record({ systolic: fc.integer({ min: 100, max: 230 }), diastolic: fc.integer({ min: 50, max: 99 }) }), { maxLength: 4 }),
  conditions: fc.subarray(['hypertension', 'heart-disease', 'pregnancy', 'glaucoma'] as const),
  injuredRegions: fc.subarray(['knee', 'shoulder', 'wrist', 'lower-back'] as const),
  medications: fc.subarray(['beta-blocker', 'diuretic'] as const),
}, { requiredKeys: [] })

/** A mostly well-formed document: valid holds and rests, breathing tied to real holds or following on. */
export const wellFormedProtocol: fc.Arbitrary<Protocol> = fc.array(
  fc.oneof(
    { weight: 3, arbitrary: fc.record({ kind: fc.constant('hold' as const), block: fc.constantFrom('wall-squat', 'handgrip-hold', 'split-squat-hold'), sets: fc.integer({ min: 1, max: 4 }), hold: fc.integer({ min: 30, max: 150 }), rest: fc.integer({ min: 0, max: 120 }) }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('rest' as const), block: fc.constantFrom('rest-seated', 'rest-standing'), rest: fc.integer({ min: 10, max: 120 }) }) },
  ),
  { minLength: 1, maxLength: 6 },
).chain((body) => {
  const holds = body.flatMap((b, i) => b.kind === 'hold' ? [i] : [])
  const breath = fc.record({
    kind: fc.constant('breath' as const),
    block: fc.constantFrom('pattern-4-7-8', 'pattern-box-4', 'pattern-exhale-4-6', 'pattern-slow-5-5'),
    length: holds.length
      ? fc.oneof(fc.constantFrom(...holds).map(i => ({ during: { track: 0, block: i } })), fc.record({ duration: fc.integer({ min: 5, max: 200 }) }))
      : fc.record({ duration: fc.integer({ min: 5, max: 200 }) }),
  }).map(({ length, ...b }) => ({ ...b, ...length }))
  return fc.record({
    format: fc.constant(1 as const),
    name: fc.constant('Generated'),
    tracks: fc.tuple(fc.array(breath, { maxLength: 4 }), fc.array(breath, { maxLength: 2 })).map(([a, b]) => [{ kind: 'body' as const, blocks: body }, { kind: 'breath' as const, blocks: a }, { kind: 'breath' as const, blocks: b }]),
  })
}) as fc.Arbitrary<Protocol>

/** Either kind of document, half and half. */
export const someProtocol: fc.Arbitrary<Protocol> = fc.oneof(anyProtocol, wellFormedProtocol)

import Ajv from 'ajv'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import jsonSchema from '../../shared/protocol/protocol.schema.json'
import { ProtocolSchema } from '../../shared/protocol/schema'
import { someProtocol } from './support/arbitraries'

// Both count string length in Unicode code points (zod 4 and ajv 8 alike).
const ajv = new Ajv({ allErrors: true, strict: true, strictRequired: false })
const validate = ajv.compile(jsonSchema)

const agree = (doc: unknown) => {
  const z = ProtocolSchema.safeParse(doc).success
  const a = validate(doc)
  expect({ doc, ajv: a }).toEqual({ doc, ajv: z })
  return z
}

const base = {
  format: 1,
  name: 'Wall squat with paced breath',
  tracks: [
    { kind: 'body', blocks: [{ kind: 'hold', block: 'wall-squat', sets: 4, hold: 120, rest: 120, target: { kneeAngle: 110, effort: 7 } }] },
    { kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-4-7-8', during: { track: 0, block: 0 } }] },
  ],
}

/** Replaces the value at a path (array of keys) in a deep copy. */
function withValue(doc: unknown, path: Array<string | number>, value: unknown): unknown {
  const copy = structuredClone(doc) as Record<string, unknown>
  let node: Record<string | number, unknown> = copy
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>
  const last = path.at(-1)!
  if (value === undefined) delete node[last]
  else node[last] = value
  return copy
}

/** Every path to a value inside a JSON document. */
function paths(value: unknown, prefix: Array<string | number> = []): Array<Array<string | number>> {
  if (value === null || typeof value !== 'object') return [prefix]
  const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value)
  return [prefix, ...entries.flatMap(([k, v]) => paths(v, [...prefix, k]))]
}

describe('the zod schema and the JSON Schema accept and reject the same documents', () => {
  it('both accept the reference wall-squat document', () => {
    expect(agree(base)).toBe(true)
  })

  it.each([
    ['format 2', withValue(base, ['format'], 2)],
    ['no name', withValue(base, ['name'], undefined)],
    ['an empty name', withValue(base, ['name'], '')],
    ['a name of 201 characters', withValue(base, ['name'], 'x'.repeat(201))],
    ['a name of 200 astral symbols (400 UTF-16 units)', withValue(base, ['name'], '😀'.repeat(200))],
    ['a name of 201 astral symbols', withValue(base, ['name'], '😀'.repeat(201))],
    ['a fractional hold', withValue(base, ['tracks', 0, 'blocks', 0, 'hold'], 120.5)],
    ['a hold given as text', withValue(base, ['tracks', 0, 'blocks', 0, 'hold'], '120')],
    ['a hold beyond 24 h', withValue(base, ['tracks', 0, 'blocks', 0, 'hold'], 86_401)],
    ['a negative hold (structural error, but schema-valid)', withValue(base, ['tracks', 0, 'blocks', 0, 'hold'], -5)],
    ['an unknown field on a hold', withValue(base, ['tracks', 0, 'blocks', 0, 'hodl'], 120)],
    ['a breathing block on a body track', withValue(base, ['tracks', 0, 'blocks', 1], { kind: 'breath', block: 'pattern-4-7-8', duration: 60 })],
    ['a hold on a breath track', withValue(base, ['tracks', 1, 'blocks', 1], { kind: 'hold', block: 'plank', sets: 1, hold: 30 })],
    ['a track of an unknown kind', withValue(base, ['tracks', 1, 'kind'], 'arms')],
    ['a block without kind', withValue(base, ['tracks', 0, 'blocks', 0, 'kind'], undefined)],
    ['a library id with capitals', withValue(base, ['tracks', 0, 'blocks', 0, 'block'], 'Wall-Squat')],
    ['a tie with both index and id', withValue(base, ['tracks', 1, 'blocks', 0, 'during'], { track: 0, block: 0, id: 'x' })],
    ['a tie by id', withValue(base, ['tracks', 1, 'blocks', 0, 'during'], { id: 'hold-1' })],
    ['an effort of 11', withValue(base, ['tracks', 0, 'blocks', 0, 'target', 'effort'], 11)],
    ['an inline pattern with a missing phase', withValue(base, ['tracks', 1, 'blocks', 0, 'pattern'], { inhale: 4, exhale: 6 })],
    ['tracks that are not a list', withValue(base, ['tracks'], {})],
    ['a target range', withValue(base, ['targets'], { tensionSeconds: { min: 300, max: 600 } })],
    ['null notes', withValue(base, ['notes'], null)],
  ])('they agree on %s', (_label, doc) => {
    agree(doc)
  })

  it('they agree on every generated document (fast-check)', () => {
    fc.assert(fc.property(someProtocol, (p) => {
      expect(agree(p)).toBe(true)
    }), { numRuns: 300 })
  })

  it('they agree on generated documents with one value replaced by anything JSON can hold (fast-check)', () => {
    const mutated = someProtocol.chain((p) => {
      const all = paths(p).filter(path => path.length > 0)
      return fc.tuple(fc.constantFrom(...all), fc.oneof(fc.jsonValue({ maxDepth: 2 }), fc.constant(undefined), fc.string({ unit: 'binary', maxLength: 210 }), fc.integer({ min: -100_000, max: 100_000 })))
        .map(([path, value]) => withValue(p, path, value))
    })
    fc.assert(fc.property(mutated, doc => void agree(doc)), { numRuns: 1000 })
  })

  it('they agree on arbitrary JSON values', () => {
    fc.assert(fc.property(fc.jsonValue(), doc => void agree(doc)), { numRuns: 300 })
  })
})

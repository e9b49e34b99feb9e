// The studio's working form of a document: ids everywhere, breathing tied to holds by id.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { analyze } from '../../shared/protocol/analyze'
import { ProtocolSchema, type Protocol } from '../../shared/protocol/schema'
import { emptyProtocol, findBlock, fitsTrack, normalizeDocument } from '../../shared/studio/document'
import { someProtocol } from './support/arbitraries'
import { repoLibrary } from './support/repo-library'

const ids = (doc: Protocol) => doc.tracks.flatMap(t => [t.id, ...t.blocks.map(b => b.id)])
const withoutIds = (metrics: ReturnType<typeof analyze>['metrics']) => ({ ...metrics, sets: metrics.sets.map(({ blockId, ...s }) => (void blockId, s)) })

describe('normalizeDocument', () => {
  it('gives every track and block its own id and keeps the document valid', () => {
    fc.assert(fc.property(someProtocol, (doc) => {
      const out = normalizeDocument(doc)
      const all = ids(out)
      expect(all.every(id => typeof id === 'string')).toBe(true)
      expect(new Set(all).size).toBe(all.length)
      expect(ProtocolSchema.safeParse(out).success).toBe(true)
    }), { numRuns: 300 })
  })

  it('does not change what the engine computes for a document whose ids were already distinct', () => {
    const { blocks: library, rules } = repoLibrary()
    const distinct = someProtocol.filter((doc) => {
      const given = ids(doc).filter(Boolean)
      return new Set(given).size === given.length
    })
    fc.assert(fc.property(distinct, (doc) => {
      const before = analyze(doc, { library, rules })
      const after = analyze(normalizeDocument(doc), { library, rules })
      expect(after.timeline).toEqual(before.timeline)
      expect(withoutIds(after.metrics)).toEqual(withoutIds(before.metrics))
      expect(after.findings.map(f => [f.rule, f.severity])).toEqual(before.findings.map(f => [f.rule, f.severity]))
    }), { numRuns: 300 })
  })

  it('turns a tie by position into a tie by id that survives reordering the body track', () => {
    const doc: Protocol = {
      format: 1, name: 'Tied',
      tracks: [
        { kind: 'body', blocks: [{ kind: 'rest', block: 'rest-seated', rest: 60 }, { kind: 'hold', block: 'wall-squat', sets: 2, hold: 60, rest: 60 }] },
        { kind: 'breath', blocks: [{ kind: 'breath', block: 'pattern-4-7-8', during: { track: 0, block: 1 } }, { kind: 'breath', block: 'pattern-box-4', during: { track: 0, block: 0 } }] },
      ],
    }
    const out = normalizeDocument(doc)
    const hold = out.tracks[0]!.blocks[1]!
    expect(out.tracks[1]!.blocks[0]!).toMatchObject({ during: { id: hold.id } })
    // A tie to a rest is not a tie to a hold: it stays as it was, for the engine to report.
    expect(out.tracks[1]!.blocks[1]!).toMatchObject({ during: { track: 0, block: 0 } })
    // Swap the rest and the hold: the breathing still runs during the hold.
    out.tracks[0]!.blocks.reverse()
    const { blocks: library, rules } = repoLibrary()
    const { metrics } = analyze(out, { library, rules })
    // 4-7-8 (in 4 s, hold 7 s, out 8 s; common practice) over a 60 s set: three whole cycles
    // hold 21 s and the fourth, started at 57 s, ends inside its inhale: 21 s a set, 42 s for two.
    expect(metrics.retentionUnderTensionSeconds).toBe(42)
    expect(doc.tracks[0]!.blocks[0]!.id).toBeUndefined() // the input is not changed
  })

  it('renames a repeated id so that each block can be found and moved on its own', () => {
    const doc = emptyProtocol('Twins')
    doc.tracks[0]!.blocks.push({ kind: 'rest', id: 'same', block: 'rest-seated', rest: 30 }, { kind: 'rest', id: 'same', block: 'rest-standing', rest: 30 })
    const out = normalizeDocument(doc)
    const [a, b] = out.tracks[0]!.blocks
    expect(a!.id).toBe('same')
    expect(b!.id).not.toBe('same')
    expect(findBlock(out, b!.id!)).toMatchObject({ track: 0, index: 1 })
  })

  it('lets holds and rests onto body tracks only, breathing onto breath tracks only', () => {
    expect([fitsTrack('hold', { kind: 'body' }), fitsTrack('rest', { kind: 'body' }), fitsTrack('breath', { kind: 'body' })]).toEqual([true, true, false])
    expect([fitsTrack('hold', { kind: 'breath' }), fitsTrack('breath', { kind: 'breath' })]).toEqual([false, true])
  })
})

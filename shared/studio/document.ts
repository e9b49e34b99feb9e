import { customAlphabet } from 'nanoid'
import type { BreathBlock, Protocol, ProtocolBlock, Track } from '../protocol/schema'

// The studio's working form of a protocol document: every track and block carries an
// id, and breathing ties point at a hold by id. Ties by index break when blocks are
// reordered; ties by id survive every drag, so the studio converts them once on load.

/** A short id for a block or track; url-safe, valid for BlockIdSchema. */
export const newBlockId = customAlphabet('0123456789abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ', 10)

/** A protocol with one empty body track and one empty breath track. */
export function emptyProtocol(name = 'Untitled protocol'): Protocol {
  return {
    format: 1,
    name,
    tracks: [
      { id: newBlockId(), kind: 'body', label: 'Body', blocks: [] },
      { id: newBlockId(), kind: 'breath', label: 'Breath', blocks: [] },
    ],
  }
}

/**
 * Returns a copy in which every track and block has an id and every tie names its hold by id.
 * A tie by index that points at no hold is kept as it is, so the engine still reports it.
 */
export function normalizeDocument(source: Protocol): Protocol {
  const doc = structuredClone(source)
  const seen = new Set<string>()
  const fresh = (id: string | undefined) => {
    if (id !== undefined && !seen.has(id)) {
      seen.add(id)
      return id
    }
    let next = newBlockId()
    while (seen.has(next)) next = newBlockId()
    seen.add(next)
    return next
  }
  for (const track of doc.tracks) {
    track.id = fresh(track.id)
    for (const block of track.blocks) block.id = fresh(block.id)
  }
  for (const track of doc.tracks) {
    if (track.kind !== 'breath') continue
    for (const block of track.blocks) {
      const tie = block.during
      if (!tie || 'id' in tie) continue
      const target = doc.tracks[tie.track]
      const hold = target?.kind === 'body' ? target.blocks[tie.block] : undefined
      if (hold?.kind === 'hold' && hold.id) block.during = { id: hold.id }
    }
  }
  return doc
}

/** Where a block sits in a document. */
export interface BlockPlace {
  track: number
  index: number
  block: ProtocolBlock
}

/** Finds a block by id (linear; documents hold at most a few thousand blocks). */
export function findBlock(doc: Protocol, id: string): BlockPlace | undefined {
  for (let t = 0; t < doc.tracks.length; t++) {
    const blocks = doc.tracks[t]!.blocks as ProtocolBlock[]
    for (let i = 0; i < blocks.length; i++) {
      if (blocks[i]!.id === id) return { track: t, index: i, block: blocks[i]! }
    }
  }
  return undefined
}

/** True when a block of `kind` may sit on `track` (holds and rests on body tracks, breathing on breath tracks). */
export function fitsTrack(kind: ProtocolBlock['kind'], track: Pick<Track, 'kind'>): boolean {
  return track.kind === 'body' ? kind === 'hold' || kind === 'rest' : kind === 'breath'
}

/** Breathing blocks tied (by id) to the hold `holdId`. */
export function breathTiedTo(doc: Protocol, holdId: string): BreathBlock[] {
  const out: BreathBlock[] = []
  for (const track of doc.tracks) {
    if (track.kind !== 'breath') continue
    for (const block of track.blocks) {
      if (block.during && 'id' in block.during && block.during.id === holdId) out.push(block)
    }
  }
  return out
}

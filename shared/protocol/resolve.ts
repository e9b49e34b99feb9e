import type { BreathLibraryBlock, HoldLibraryBlock, LibraryBlock, RestLibraryBlock } from '../library/types'
import type { Finding, FindingLocation } from './findings'
import { STANDARD_CAUTION } from './findings'
import type { BreathBlock, HoldBlock, Protocol, RestBlock } from './schema'

// First pass over a document: look every block up in the library, check the structure
// and work out each block's numbers. Linear in the number of blocks.

export interface ResolvedHold {
  kind: 'hold'
  src: HoldBlock
  lib: HoldLibraryBlock | undefined
  /** False when a duration or count is not positive: the block is left off the timeline. */
  placeable: boolean
  sets: number
  hold: number
  rest: number
}

export interface ResolvedRest {
  kind: 'rest'
  src: RestBlock
  lib: RestLibraryBlock | undefined
  placeable: boolean
  rest: number
}

export interface ResolvedBreath {
  kind: 'breath'
  src: BreathBlock
  lib: BreathLibraryBlock | undefined
  placeable: boolean
  inhale: number
  holdIn: number
  exhale: number
  holdOut: number
  cycleSeconds: number
  /** Seconds of one free-standing run (duration or cycles × cycle); 0 when tied. */
  length: number
  /** The hold this block runs during, as track and block index; -1 when free-standing. */
  tieTrack: number
  tieBlock: number
}

export type ResolvedBlock = ResolvedHold | ResolvedRest | ResolvedBreath

export interface ResolvedTrack {
  kind: 'body' | 'breath'
  blocks: ResolvedBlock[]
}

export interface Resolved {
  tracks: ResolvedTrack[]
  blockCount: number
}

const indexCache = new WeakMap<readonly LibraryBlock[], Map<string, LibraryBlock>>()

/** Library blocks by id, cached per library array. */
export function libraryIndex(blocks: readonly LibraryBlock[]): Map<string, LibraryBlock> {
  let index = indexCache.get(blocks)
  if (!index) {
    index = new Map(blocks.map(b => [b.id, b]))
    indexCache.set(blocks, index)
  }
  return index
}

/** Builds a structural error at a location. */
export function structural(rule: string, message: string, location: FindingLocation, fix?: Finding['fix']): Finding {
  const finding: Finding = { rule, severity: 'error', message, location, caution: STANDARD_CAUTION }
  if (fix) finding.fix = fix
  return finding
}

function at(track: number, block: number, id: string | undefined, set?: number): FindingLocation {
  const location: FindingLocation = { track, block }
  if (set !== undefined) location.set = set
  if (id !== undefined) location.blockId = id
  return location
}

/** Resolves every block and appends structural findings to `findings`. */
export function resolveProtocol(protocol: Protocol, library: readonly LibraryBlock[], findings: Finding[]): Resolved {
  const index = libraryIndex(library)
  const tracks: ResolvedTrack[] = []
  const ids = new Map<string, FindingLocation>()
  let blockCount = 0
  let bodyIds: Map<string, [number, number, boolean]> | undefined

  const where = (t: number, b: number, id: string | undefined) => {
    if (id === undefined) return
    const seen = ids.get(id)
    if (seen) findings.push(structural('structure.duplicate-id', `The block id "${id}" is used twice (also at track ${seen.track! + 1}, block ${seen.block! + 1}); each block needs its own id.`, at(t, b, id)))
    else ids.set(id, { track: t, block: b })
  }

  const lookup = <K extends LibraryBlock['kind']>(kind: K, name: string, t: number, b: number, id: string | undefined): Extract<LibraryBlock, { kind: K }> | undefined => {
    const lib = index.get(name)
    if (!lib) {
      findings.push(structural('structure.unknown-block', `"${name}" is not a block in the library.`, at(t, b, id)))
      return undefined
    }
    if (lib.kind !== kind) {
      findings.push(structural('structure.wrong-kind', `"${name}" is a ${lib.kind} block and cannot be used as a ${kind} block.`, at(t, b, id)))
      return undefined
    }
    return lib as Extract<LibraryBlock, { kind: K }>
  }

  const positive = (value: number, what: string, t: number, b: number, id: string | undefined): boolean => {
    if (value > 0) return true
    findings.push(structural('structure.non-positive-duration', `${what} must be more than 0 (it is ${value}).`, at(t, b, id)))
    return false
  }

  for (let t = 0; t < protocol.tracks.length; t++) {
    const track = protocol.tracks[t]!
    const blocks: ResolvedBlock[] = []
    blockCount += track.blocks.length
    if (track.kind === 'body') {
      for (let b = 0; b < track.blocks.length; b++) {
        const src = track.blocks[b]!
        where(t, b, src.id)
        if (src.kind === 'hold') {
          const lib = lookup('hold', src.block, t, b, src.id)
          const rest = src.rest ?? 0
          let placeable = positive(src.sets, 'The number of sets', t, b, src.id)
          placeable = positive(src.hold, 'The hold', t, b, src.id) && placeable
          if (rest < 0) {
            findings.push(structural('structure.non-positive-duration', `The rest between sets cannot be negative (it is ${rest} s).`, at(t, b, src.id)))
            placeable = false
          }
          blocks.push({ kind: 'hold', src, lib, placeable, sets: src.sets, hold: src.hold, rest })
        }
        else {
          const lib = lookup('rest', src.block, t, b, src.id)
          const placeable = positive(src.rest, 'The rest', t, b, src.id)
          blocks.push({ kind: 'rest', src, lib, placeable, rest: src.rest })
        }
      }
    }
    else {
      for (let b = 0; b < track.blocks.length; b++) {
        const src = track.blocks[b]!
        where(t, b, src.id)
        blocks.push(resolveBreath(src, t, b))
      }
    }
    tracks.push({ kind: track.kind, blocks })
  }

  function resolveBreath(src: BreathBlock, t: number, b: number): ResolvedBreath {
    const lib = src.block === undefined ? undefined : lookup('breath', src.block, t, b, src.id)
    const base = src.pattern ?? lib?.pattern
    const inhale = src.pattern ? src.pattern.inhale ?? 0 : base?.inhale ?? 0
    const holdIn = src.pattern ? src.pattern.holdIn ?? 0 : base?.holdIn ?? 0
    const exhale = src.pattern ? src.pattern.exhale ?? 0 : base?.exhale ?? 0
    const holdOut = src.pattern ? src.pattern.holdOut ?? 0 : base?.holdOut ?? 0
    let placeable = true
    if (!src.pattern && src.block === undefined) {
      findings.push(structural('structure.breath-pattern', 'A breathing block needs a library pattern (block) or its own pattern.', at(t, b, src.id)))
      placeable = false
    }
    else if (!base) {
      placeable = false // unknown library block, already reported
    }
    else if (inhale < 0 || holdIn < 0 || exhale < 0 || holdOut < 0) {
      findings.push(structural('structure.non-positive-duration', 'A breathing phase cannot be negative.', at(t, b, src.id)))
      placeable = false
    }
    else if (inhale + holdIn + exhale + holdOut <= 0) {
      findings.push(structural('structure.non-positive-duration', 'A breathing cycle must last more than 0 s.', at(t, b, src.id)))
      placeable = false
    }
    const cycleSeconds = inhale + holdIn + exhale + holdOut
    const modes = Number(src.duration !== undefined) + Number(src.cycles !== undefined) + Number(src.during !== undefined)
    let length = 0
    let tieTrack = -1
    let tieBlock = -1
    if (modes !== 1) {
      findings.push(structural('structure.breath-length', modes === 0
        ? 'A breathing block needs a duration, a number of cycles, or a hold to run during.'
        : 'A breathing block takes only one of duration, cycles or during.', at(t, b, src.id)))
      placeable = false
    }
    else if (src.during) {
      const tie = findTie(src.during)
      if (!tie) {
        findings.push(structural('structure.tie-missing', 'This breathing block is tied to a hold that does not exist.', at(t, b, src.id),
          { message: 'Tie it to a hold on a body track, or give it a duration instead.' }))
        placeable = false
      }
      else {
        tieTrack = tie[0]
        tieBlock = tie[1]
      }
      if (src.start !== undefined) {
        findings.push(structural('structure.breath-length', 'A breathing block tied to a hold starts with the hold; remove its start.', at(t, b, src.id),
          { message: 'Remove the start time.', patch: [{ op: 'remove', path: `/tracks/${t}/blocks/${b}/start` }] }))
        placeable = false
      }
    }
    else if (src.duration !== undefined) {
      if (positive(src.duration, 'The breathing duration', t, b, src.id)) length = src.duration
      else placeable = false
    }
    else if (src.cycles !== undefined) {
      if (positive(src.cycles, 'The number of breathing cycles', t, b, src.id)) length = src.cycles * cycleSeconds
      else placeable = false
    }
    if (src.start !== undefined && src.start < 0) {
      findings.push(structural('structure.non-positive-duration', `The start cannot be negative (it is ${src.start} s).`, at(t, b, src.id)))
      placeable = false
    }
    return { kind: 'breath', src, lib, placeable, inhale, holdIn, exhale, holdOut, cycleSeconds, length, tieTrack, tieBlock }
  }

  function findTie(during: NonNullable<BreathBlock['during']>): [number, number] | undefined {
    if ('id' in during) {
      if (!bodyIds) {
        // Built once, on first use, so ties by id stay linear.
        bodyIds = new Map()
        for (let t = 0; t < protocol.tracks.length; t++) {
          const track = protocol.tracks[t]!
          if (track.kind !== 'body') continue
          for (let b = 0; b < track.blocks.length; b++) {
            const id = track.blocks[b]!.id
            if (id !== undefined && !bodyIds.has(id)) bodyIds.set(id, [t, b, track.blocks[b]!.kind === 'hold'])
          }
        }
      }
      const hit = bodyIds.get(during.id)
      return hit && hit[2] ? [hit[0], hit[1]] : undefined
    }
    const track = protocol.tracks[during.track]
    if (!track || track.kind !== 'body') return undefined
    return track.blocks[during.block]?.kind === 'hold' ? [during.track, during.block] : undefined
  }

  if (blockCount === 0) {
    findings.push(structural('structure.empty', 'The protocol has no blocks yet.', {}, { message: 'Add a hold or a breathing block to a track.' }))
  }
  return { tracks, blockCount }
}

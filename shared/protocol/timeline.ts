import type { LibraryBlock } from '../library/types'
import type { Finding } from './findings'
import type { Resolved, ResolvedBreath } from './resolve'
import { resolveProtocol } from './resolve'
import type { Protocol } from './schema'

// Expands a document into exact whole-second intervals per track.
// Body tracks run their blocks one after another from 0. On a breath track a block
// tied to a hold runs during each set of that hold; a free-standing block starts at
// its `start` or, without one, where the track's previous block ended. A block that
// would begin before the previous one ended is left off and reported as an overlap.

export type IntervalKind = 'set' | 'rest' | 'inhale' | 'hold-in' | 'exhale' | 'hold-out'

/** One stretch of time on a track, [start, end) in seconds. */
export interface Interval {
  start: number
  end: number
  what: IntervalKind
  /** Index of the block on its track. */
  block: number
  /** Set number (from 1) for sets, rests between sets and breathing during a set; 0 otherwise. */
  set: number
  /** Breathing cycle number (from 1) within the set or run; 0 for body intervals. */
  cycle: number
  /** True for every phase of a breathing cycle cut off before it completed. */
  partial: boolean
}

/** Interval kinds by their code in `IntervalColumns.what`. */
export const INTERVAL_KINDS: readonly IntervalKind[] = ['set', 'rest', 'inhale', 'hold-in', 'exhale', 'hold-out']
export const SET = 0
export const REST = 1
export const HOLD_IN = 3
export const HOLD_OUT = 5

/** A track's intervals as parallel typed arrays (no per-interval objects; cheap to build and to read). */
export interface IntervalColumns {
  length: number
  start: Int32Array
  end: Int32Array
  /** Index into INTERVAL_KINDS. */
  what: Uint8Array
  block: Int32Array
  set: Int32Array
  cycle: Int32Array
  partial: Uint8Array
}

export interface TrackTimeline {
  track: number
  kind: 'body' | 'breath'
  /** When the track's last interval ends. */
  end: number
  /** The same intervals as `intervals`, column by column (not serialised). */
  readonly columns: IntervalColumns
  /** The intervals as objects, built on first read (and when serialised to JSON). */
  readonly intervals: Interval[]
}

class ColumnBuilder {
  length = 0
  private cap: number
  start: Int32Array
  end: Int32Array
  what: Uint8Array
  block: Int32Array
  set: Int32Array
  cycle: Int32Array
  partial: Uint8Array
  constructor(cap = 64) {
    this.cap = cap
    this.start = new Int32Array(cap)
    this.end = new Int32Array(cap)
    this.what = new Uint8Array(cap)
    this.block = new Int32Array(cap)
    this.set = new Int32Array(cap)
    this.cycle = new Int32Array(cap)
    this.partial = new Uint8Array(cap)
  }

  private grow(): void {
    this.cap *= 2
    const g = <T extends Int32Array | Uint8Array>(a: T): T => {
      const b = new (a.constructor as new (n: number) => T)(this.cap)
      b.set(a)
      return b
    }
    this.start = g(this.start)
    this.end = g(this.end)
    this.what = g(this.what)
    this.block = g(this.block)
    this.set = g(this.set)
    this.cycle = g(this.cycle)
    this.partial = g(this.partial)
  }

  push(start: number, end: number, what: number, block: number, set: number, cycle: number, partial: boolean): void {
    if (this.length === this.cap) this.grow()
    const i = this.length++
    this.start[i] = start
    this.end[i] = end
    this.what[i] = what
    this.block[i] = block
    this.set[i] = set
    this.cycle[i] = cycle
    this.partial[i] = partial ? 1 : 0
  }

  finish(): IntervalColumns {
    const n = this.length
    return {
      length: n,
      start: this.start.subarray(0, n),
      end: this.end.subarray(0, n),
      what: this.what.subarray(0, n),
      block: this.block.subarray(0, n),
      set: this.set.subarray(0, n),
      cycle: this.cycle.subarray(0, n),
      partial: this.partial.subarray(0, n),
    }
  }
}

/** The intervals of some columns as objects. */
export function intervalsOf(c: IntervalColumns): Interval[] {
  const out: Interval[] = Array.from({ length: c.length })
  for (let i = 0; i < c.length; i++) {
    out[i] = { start: c.start[i]!, end: c.end[i]!, what: INTERVAL_KINDS[c.what[i]!]!, block: c.block[i]!, set: c.set[i]!, cycle: c.cycle[i]!, partial: c.partial[i] === 1 }
  }
  return out
}

function trackTimeline(track: number, kind: 'body' | 'breath', end: number, columns: IntervalColumns): TrackTimeline {
  let cached: Interval[] | undefined
  const t = { track, kind, end } as TrackTimeline
  Object.defineProperty(t, 'columns', { value: columns, enumerable: false })
  Object.defineProperty(t, 'intervals', { get: () => (cached ??= intervalsOf(columns)), enumerable: true })
  return t
}

export interface Overlap {
  track: number
  block: number
  /** Where the block wanted to start, and where the track was already busy until. */
  start: number
  busyUntil: number
}

export interface Timeline {
  /** Session length: the latest end over all tracks. */
  duration: number
  tracks: TrackTimeline[]
  overlaps: Overlap[]
  /** True when expansion stopped at `maxIntervals`. */
  truncated: boolean
}

export interface TimelineLimits {
  /** Stop expanding after this many intervals (guards against hostile documents). */
  maxIntervals?: number
}

/** Default interval budget; a real session is a few thousand. */
export const DEFAULT_MAX_INTERVALS = 2_000_000

/** Expands resolved blocks into a timeline (see resolveProtocol). */
export function timelineFromResolved(resolved: Resolved, limits: TimelineLimits = {}): Timeline {
  const max = limits.maxIntervals ?? DEFAULT_MAX_INTERVALS
  let count = 0
  let truncated = false
  const tracks: TrackTimeline[] = Array.from({ length: resolved.tracks.length })
  const overlaps: Overlap[] = []
  // Start second of each hold block, per track; -1 when not placed.
  const holdStarts: Int32Array[] = resolved.tracks.map(t => t.kind === 'body' ? new Int32Array(t.blocks.length).fill(-1) : new Int32Array(0))

  const push = (list: ColumnBuilder, start: number, end: number, what: number, block: number, set: number, cycle: number, partial: boolean) => {
    if (count >= max) {
      truncated = true
      return
    }
    count++
    list.push(start, end, what, block, set, cycle, partial)
  }

  for (let t = 0; t < resolved.tracks.length; t++) {
    const track = resolved.tracks[t]!
    if (track.kind !== 'body') continue
    const list = new ColumnBuilder()
    const starts = holdStarts[t]!
    let cursor = 0
    for (let b = 0; b < track.blocks.length; b++) {
      const block = track.blocks[b]!
      if (!block.placeable) continue
      if (block.kind === 'hold') {
        starts[b] = cursor
        for (let s = 1; s <= block.sets; s++) {
          push(list, cursor, cursor + block.hold, SET, b, s, 0, false)
          cursor += block.hold
          if (s < block.sets && block.rest > 0) {
            push(list, cursor, cursor + block.rest, REST, b, s, 0, false)
            cursor += block.rest
          }
        }
      }
      else if (block.kind === 'rest') {
        push(list, cursor, cursor + block.rest, REST, b, 0, 0, false)
        cursor += block.rest
      }
    }
    tracks[t] = trackTimeline(t, 'body', cursor, list.finish())
  }

  const breathe = (list: ColumnBuilder, block: ResolvedBreath, b: number, set: number, from: number, to: number) => {
    const phases = [block.inhale, block.holdIn, block.exhale, block.holdOut]
    let time = from
    for (let cycle = 1; time < to; cycle++) {
      const partial = time + block.cycleSeconds > to
      for (let p = 0; p < 4 && time < to; p++) {
        const len = phases[p]!
        if (len === 0) continue
        const end = time + len < to ? time + len : to
        push(list, time, end, p + 2, b, set, cycle, partial)
        time = end
      }
      if (truncated) return
    }
  }

  for (let t = 0; t < resolved.tracks.length; t++) {
    const track = resolved.tracks[t]!
    if (track.kind !== 'breath') continue
    const list = new ColumnBuilder()
    let cursor = 0
    for (let b = 0; b < track.blocks.length; b++) {
      const block = track.blocks[b]!
      if (!block.placeable || block.kind !== 'breath') continue
      if (block.tieTrack >= 0) {
        const hold = resolved.tracks[block.tieTrack]!.blocks[block.tieBlock]!
        const first = holdStarts[block.tieTrack]![block.tieBlock]!
        if (hold.kind !== 'hold' || first < 0) continue // the hold itself is broken and already reported
        if (first < cursor) {
          overlaps.push({ track: t, block: b, start: first, busyUntil: cursor })
          continue
        }
        let start = first
        for (let s = 1; s <= hold.sets; s++) {
          breathe(list, block, b, s, start, start + hold.hold)
          cursor = start + hold.hold
          start = cursor + (s < hold.sets ? hold.rest : 0)
        }
      }
      else {
        const start = block.src.start ?? cursor
        if (start < cursor) {
          overlaps.push({ track: t, block: b, start, busyUntil: cursor })
          continue
        }
        breathe(list, block, b, 0, start, start + block.length)
        cursor = start + block.length
      }
    }
    tracks[t] = trackTimeline(t, 'breath', cursor, list.finish())
  }

  let duration = 0
  for (const track of tracks) if (track.end > duration) duration = track.end
  return { duration, tracks, overlaps, truncated }
}

/** Expands a protocol into its timeline; structural findings go to `findings` when given. */
export function buildTimeline(protocol: Protocol, library: readonly LibraryBlock[], limits?: TimelineLimits, findings: Finding[] = []): Timeline {
  return timelineFromResolved(resolveProtocol(protocol, library, findings), limits)
}

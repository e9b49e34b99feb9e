import type { Resolved } from './resolve'
import type { IntervalColumns, Timeline } from './timeline'

// Codes of INTERVAL_KINDS in timeline.ts, repeated as local constants so the hot loops
// read plain numbers rather than another module's live bindings.
const SET = 0
const REST = 1
const HOLD_IN = 3
const HOLD_OUT = 5

// Session and weekly figures, read off the timeline in one sweep per pair of tracks.

/** Figures for one set of a hold. */
export interface SetMetrics {
  track: number
  block: number
  blockId?: string
  set: number
  start: number
  end: number
  holdSeconds: number
  /** Rest that follows this set: the rest between sets, or a rest block right after the last set. */
  restAfterSeconds: number
  workRestRatio: number | null
  /** Breathing cycles that fall inside the set: whole ones, and ones cut off by its end or start. */
  breathCycles: { whole: number, partial: number }
  /** Seconds of breath held (after inhale or after exhale) while the set runs. */
  retentionSeconds: number
  longestRetentionSeconds: number
}

export interface Metrics {
  sessionSeconds: number
  /** Sum of every set's hold on every body track. */
  tensionSeconds: number
  /** Rest on body tracks: between sets and rest blocks. */
  restSeconds: number
  /** tensionSeconds / restSeconds to 2 decimals; null without rest. */
  workRestRatio: number | null
  breathSeconds: number
  /** Breathing cycles, counting a cut-off cycle by the share of it breathed, to 2 decimals. */
  breathCycles: number
  /** Cycles per minute of breathing, to 2 decimals; null without breathing. */
  breathsPerMinute: number | null
  /** All breath held, under tension or not. */
  retentionSeconds: number
  retentionUnderTensionSeconds: number
  longestRetentionUnderTensionSeconds: number
  holdCount: number
  setCount: number
  sessionsPerWeek: number | null
  weeklyTensionSeconds: number | null
  weeklySessionSeconds: number | null
  sets: SetMetrics[]
}

/** Per-block figures the rules read (indexed [track][block]). */
export interface BlockStats {
  retentionUnderTension: Float64Array[]
  longestRetentionUnderTension: Float64Array[]
}

const round2 = (x: number) => Math.round(x * 100) / 100

/** Computes the metrics of a timeline built from `resolved`. */
export function computeMetrics(resolved: Resolved, timeline: Timeline, sessionsPerWeek?: number): { metrics: Metrics, stats: BlockStats } {
  const T = resolved.tracks.length
  const stats: BlockStats = {
    retentionUnderTension: resolved.tracks.map(t => new Float64Array(t.blocks.length)),
    longestRetentionUnderTension: resolved.tracks.map(t => new Float64Array(t.blocks.length)),
  }
  let tension = 0
  let rest = 0
  let holdCount = 0
  const setStarts: number[] = []
  const setEnds: number[] = []
  const sets: SetMetrics[] = []
  const bodyTracks: number[] = []
  const breathTracks: number[] = []

  for (let t = 0; t < T; t++) {
    const track = timeline.tracks[t]!
    if (track.kind === 'breath') {
      breathTracks.push(t)
      continue
    }
    bodyTracks.push(t)
    const blocks = resolved.tracks[t]!.blocks
    const c = track.columns
    for (let i = 0; i < c.length; i++) {
      const start = c.start[i]!
      const end = c.end[i]!
      const len = end - start
      if (c.what[i] === SET) {
        tension += len
        setStarts.push(start)
        setEnds.push(end)
        const set = c.set[i]!
        const block = c.block[i]!
        if (set === 1) holdCount++
        // The rest after this set: the next interval if it is a rest that starts when the set ends.
        const restAfter = i + 1 < c.length && c.what[i + 1] === REST && c.start[i + 1] === end ? c.end[i + 1]! - c.start[i + 1]! : 0
        const entry: SetMetrics = {
          track: t, block, set, start, end,
          holdSeconds: len, restAfterSeconds: restAfter, workRestRatio: restAfter > 0 ? round2(len / restAfter) : null,
          breathCycles: { whole: 0, partial: 0 }, retentionSeconds: 0, longestRetentionSeconds: 0,
        }
        const id = blocks[block]!.src.id
        if (id !== undefined) entry.blockId = id
        sets.push(entry)
      }
      else {
        rest += len
      }
    }
  }

  // Union of set intervals over all body tracks, so parallel holds are not counted twice.
  let order: number[] | undefined
  if (bodyTracks.length > 1) order = setStarts.map((_, i) => i).sort((a, b) => setStarts[a]! - setStarts[b]!)
  const us: number[] = []
  const ue: number[] = []
  for (let j = 0; j < setStarts.length; j++) {
    const k = order ? order[j]! : j
    const start = setStarts[k]!
    const end = setEnds[k]!
    const last = ue.length - 1
    if (last >= 0 && start <= ue[last]!) {
      if (end > ue[last]!) ue[last] = end
    }
    else {
      us.push(start)
      ue.push(end)
    }
  }

  let breathSeconds = 0
  // Breathing seconds by cycle length, summed in key order so the figure is exact and order-free.
  const secondsByCycle = new Map<number, number>()
  let retention = 0
  let rut = 0
  let longest = 0
  for (const q of breathTracks) {
    const c: IntervalColumns = timeline.tracks[q]!.columns
    const blocks = resolved.tracks[q]!.blocks
    const perBlockSeconds = new Float64Array(blocks.length)
    const rutBlock = stats.retentionUnderTension[q]!
    const longestBlock = stats.longestRetentionUnderTension[q]!
    let u = 0
    let runEnd = -1
    let run = 0
    for (let i = 0; i < c.length; i++) {
      const start = c.start[i]!
      const end = c.end[i]!
      const block = c.block[i]!
      const len = end - start
      breathSeconds += len
      perBlockSeconds[block]! += len
      const what = c.what[i]
      if (what !== HOLD_IN && what !== HOLD_OUT) continue
      retention += len
      while (u < us.length && ue[u]! <= start) u++
      for (let k = u; k < us.length && us[k]! < end; k++) {
        const s = start > us[k]! ? start : us[k]!
        const e = end < ue[k]! ? end : ue[k]!
        if (e <= s) continue
        rut += e - s
        rutBlock[block]! += e - s
        run = s === runEnd ? run + (e - s) : e - s
        runEnd = e
        if (run > longest) longest = run
        if (run > longestBlock[block]!) longestBlock[block] = run
      }
    }
    for (let b = 0; b < blocks.length; b++) {
      const block = blocks[b]!
      if (perBlockSeconds[b]! > 0 && block.kind === 'breath') secondsByCycle.set(block.cycleSeconds, (secondsByCycle.get(block.cycleSeconds) ?? 0) + perBlockSeconds[b]!)
    }
  }
  let breathCycles = 0
  for (const len of [...secondsByCycle.keys()].sort((a, b) => a - b)) breathCycles += secondsByCycle.get(len)! / len

  // Per-set breathing: one pointer per (body track, breath track) pair.
  let setIndex = 0
  for (const t of bodyTracks) {
    const setsOfTrack: SetMetrics[] = []
    while (setIndex < sets.length && sets[setIndex]!.track === t) setsOfTrack.push(sets[setIndex++]!)
    for (const q of breathTracks) {
      const c = timeline.tracks[q]!.columns
      const blocks = resolved.tracks[q]!.blocks
      let p = 0
      for (const entry of setsOfTrack) {
        while (p < c.length && c.end[p]! <= entry.start) p++
        let groupBlock = -1
        let groupCycle = -1
        let groupSet = -1
        let groupSum = 0
        let runEnd = -1
        let run = 0
        for (let k = p; k <= c.length; k++) {
          const inside = k < c.length && c.start[k]! < entry.end
          const block = inside ? c.block[k]! : -1
          const s = inside && c.start[k]! > entry.start ? c.start[k]! : entry.start
          const e = inside && c.end[k]! < entry.end ? c.end[k]! : entry.end
          if (inside && e <= s) continue
          if (!inside || block !== groupBlock || c.cycle[k] !== groupCycle || c.set[k] !== groupSet) {
            if (groupBlock >= 0) {
              // Close the cycle group: whole when every second of the cycle fell inside the set.
              const b = blocks[groupBlock]!
              if (b.kind === 'breath' && groupSum === b.cycleSeconds) entry.breathCycles.whole++
              else entry.breathCycles.partial++
            }
            if (!inside) break
            groupBlock = block
            groupCycle = c.cycle[k]!
            groupSet = c.set[k]!
            groupSum = 0
          }
          groupSum += e - s
          const what = c.what[k]
          if (what === HOLD_IN || what === HOLD_OUT) {
            entry.retentionSeconds += e - s
            run = s === runEnd ? run + (e - s) : e - s
            runEnd = e
            if (run > entry.longestRetentionSeconds) entry.longestRetentionSeconds = run
          }
        }
      }
    }
  }
  for (const entry of sets) {
    stats.retentionUnderTension[entry.track]![entry.block]! += entry.retentionSeconds
    const longestOfHold = stats.longestRetentionUnderTension[entry.track]!
    if (entry.longestRetentionSeconds > longestOfHold[entry.block]!) longestOfHold[entry.block] = entry.longestRetentionSeconds
  }

  const perWeek = sessionsPerWeek ?? null
  const metrics: Metrics = {
    sessionSeconds: timeline.duration,
    tensionSeconds: tension,
    restSeconds: rest,
    workRestRatio: rest > 0 ? round2(tension / rest) : null,
    breathSeconds,
    breathCycles: round2(breathCycles),
    breathsPerMinute: breathSeconds > 0 ? round2(breathCycles * 60 / breathSeconds) : null,
    retentionSeconds: retention,
    retentionUnderTensionSeconds: rut,
    longestRetentionUnderTensionSeconds: longest,
    holdCount,
    setCount: sets.length,
    sessionsPerWeek: perWeek,
    weeklyTensionSeconds: perWeek === null ? null : tension * perWeek,
    weeklySessionSeconds: perWeek === null ? null : timeline.duration * perWeek,
    sets,
  }
  return { metrics, stats }
}

// Geometry and words for drawing a protocol on the studio's time tracks.
import type { BreathBlock, Pattern, Protocol, ProtocolBlock } from '#shared/protocol/schema'
import type { LibraryBlock } from '#shared/library/types'
import type { IntervalKind, TrackTimeline } from '#shared/protocol/timeline'

export interface FullPattern { inhale: number, holdIn: number, exhale: number, holdOut: number }

/** "2:05" for 125 s, "45 s" under a minute. */
export function formatSeconds(total: number | null | undefined): string {
  if (total === null || total === undefined || !Number.isFinite(total)) return '—'
  const s = Math.round(total)
  if (Math.abs(s) < 60) return `${s} s`
  const h = Math.floor(s / 3600)
  const m = Math.floor((s % 3600) / 60)
  const sec = String(s % 60).padStart(2, '0')
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`
}

/** Clock form for the ruler and the pacer: "0:00", "12:30". */
export function clock(total: number): string {
  const s = Math.max(0, Math.floor(total))
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`
}

export const PHASE_WORDS: Record<IntervalKind, string> = {
  'set': 'Hold',
  'rest': 'Rest',
  'inhale': 'Breathe in',
  'hold-in': 'Hold the breath in',
  'exhale': 'Breathe out',
  'hold-out': 'Pause, lungs empty',
}

/** Length of a block on a body track, in seconds; 0 while a number is not positive. */
export function bodyDuration(block: ProtocolBlock): number {
  if (block.kind === 'rest') return block.rest > 0 ? block.rest : 0
  if (block.kind !== 'hold' || block.sets <= 0 || block.hold <= 0) return 0
  const rest = block.rest ?? 0
  return block.sets * block.hold + (block.sets - 1) * Math.max(0, rest)
}

/** The breathing pattern a block runs: its own, else its library pattern. */
export function patternOf(block: BreathBlock, lib: LibraryBlock | undefined): FullPattern {
  const own: Pattern | undefined = block.pattern
  const base = lib?.kind === 'breath' ? lib.pattern : undefined
  if (own) return { inhale: own.inhale ?? 0, holdIn: own.holdIn ?? 0, exhale: own.exhale ?? 0, holdOut: own.holdOut ?? 0 }
  return base ?? { inhale: 0, holdIn: 0, exhale: 0, holdOut: 0 }
}

/** "4 · 7 · 8" (phases of length 0 left out). */
export function patternLabel(p: FullPattern): string {
  return [p.inhale, p.holdIn, p.exhale, p.holdOut].filter((x, i) => x > 0 || i === 0).join(' · ')
}

/** Colours of the breathing phases (same order as the pattern). */
export const PHASE_COLOURS = ['#8ccaca', '#1b5b5e', '#dcefef', '#4f6a79'] as const

/** Start and end of each block on a breath track, from the engine's timeline (null: not placed). */
export function breathSpans(track: TrackTimeline | undefined, count: number): ({ start: number, end: number } | null)[] {
  const spans: ({ start: number, end: number } | null)[] = Array.from({ length: count }, () => null)
  for (const iv of track?.intervals ?? []) {
    const span = spans[iv.block]
    if (!span) spans[iv.block] = { start: iv.start, end: iv.end }
    else if (iv.end > span.end) span.end = iv.end
  }
  return spans
}

/** For each hold id, the pattern of the breathing that runs during it (the first tie wins). */
export function tiedPatterns(doc: Protocol, libById: Map<string, LibraryBlock>): Map<string, string> {
  const out = new Map<string, string>()
  for (const track of doc.tracks) {
    if (track.kind !== 'breath') continue
    for (const block of track.blocks) {
      const id = block.during && 'id' in block.during ? block.during.id : undefined
      if (!id || out.has(id)) continue
      const p = patternOf(block, block.block ? libById.get(block.block) : undefined)
      out.set(id, `${p.inhale},${p.holdIn},${p.exhale},${p.holdOut}`)
    }
  }
  return out
}

/** Parses the "a,b,c,d" key tiedPatterns produces. */
export function parsePatternKey(key: string): FullPattern {
  const [inhale = 0, holdIn = 0, exhale = 0, holdOut = 0] = key.split(',').map(Number)
  return { inhale, holdIn, exhale, holdOut }
}

/** Ruler tick spacing: the smallest step that keeps labels at least `minPx` apart. */
export function tickStep(scale: number, minPx = 64): number {
  const steps = [5, 10, 15, 30, 60, 120, 300, 600, 900, 1800, 3600]
  return steps.find(s => s * scale >= minPx) ?? 3600
}

const svgCache = new Map<string, string>()
const svgUrl = (key: string, body: () => string) => {
  let url = svgCache.get(key)
  if (!url) {
    url = `url("data:image/svg+xml,${encodeURIComponent(body())}")`
    svgCache.set(key, url)
  }
  return url
}
const SET_FILL = '#f3d1b9'
const REST_FILL = '#eef2ea'

/** Breathing phases from 0 to `until` seconds, as SVG rects on a band at `y` (x in seconds). */
function phaseRects(p: FullPattern, until: number, y: number, h: number): string {
  const parts = [p.inhale, p.holdIn, p.exhale, p.holdOut]
  const cycle = parts.reduce((a, b) => a + Math.max(0, b), 0)
  if (cycle <= 0) return ''
  let out = ''
  for (let t = 0; t < until;) {
    for (let i = 0; i < 4 && t < until; i++) {
      const len = Math.min(Math.max(0, parts[i]!), until - t)
      if (len > 0) out += `<rect x="${t}" y="${y}" width="${len}" height="${h}" fill="${PHASE_COLOURS[i]}"/>`
      t += len
    }
  }
  return out
}

/**
 * One set and the rest after it (with any tied breathing at the bottom), drawn in seconds
 * and stretched to scale by background-size; repeated along the block. Identical holds share
 * one cached image, so restyling a long track stays cheap.
 */
export function holdImage(hold: number, rest: number, tied: FullPattern | null): string {
  const width = hold + Math.max(0, rest)
  const key = `h:${hold}:${rest}:${tied ? `${tied.inhale},${tied.holdIn},${tied.exhale},${tied.holdOut}` : ''}`
  return svgUrl(key, () => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} 64" preserveAspectRatio="none">`
    + `<rect width="${hold}" height="64" fill="${SET_FILL}"/>`
    + (rest > 0 ? `<rect x="${hold}" width="${rest}" height="64" fill="${REST_FILL}"/>` : '')
    + (tied ? phaseRects(tied, hold, 54, 10) : '')
    + '</svg>')
}

/** One breathing cycle (x in seconds), repeated along a breathing block. */
export function cycleImage(p: FullPattern): string {
  const cycle = p.inhale + p.holdIn + p.exhale + p.holdOut
  return svgUrl(`c:${p.inhale},${p.holdIn},${p.exhale},${p.holdOut}`, () =>
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${cycle} 12" preserveAspectRatio="none">${phaseRects(p, cycle, 0, 12)}</svg>`)
}

/** Breathing tied to a hold: the pattern during each set, nothing during the rests between. */
export function tiedBreathImage(hold: number, rest: number, p: FullPattern): string {
  const width = hold + Math.max(0, rest)
  return svgUrl(`t:${hold}:${rest}:${p.inhale},${p.holdIn},${p.exhale},${p.holdOut}`, () =>
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} 12" preserveAspectRatio="none">${phaseRects(p, hold, 0, 12)}</svg>`)
}

/** Hold and rest seconds of each hold by id ("120,60"), for drawing the breathing tied to it. */
export function holdTimings(doc: Protocol): Map<string, string> {
  const out = new Map<string, string>()
  for (const track of doc.tracks) {
    if (track.kind !== 'body') continue
    for (const b of track.blocks) if (b.kind === 'hold' && b.id) out.set(b.id, `${b.hold},${b.rest ?? 0}`)
  }
  return out
}

/** True when two maps hold the same entries (values compared with ===). */
export function sameMap<K, V>(a: Map<K, V> | undefined, b: Map<K, V>): boolean {
  if (!a || a.size !== b.size) return false
  for (const [k, v] of b) if (a.get(k) !== v) return false
  return true
}

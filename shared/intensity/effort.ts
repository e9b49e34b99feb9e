// Lamina's own effort rating, 0–10, with its own anchor words.

/** Anchor words for each whole step of the 0–10 effort rating. */
export const EFFORT_ANCHORS: readonly string[] = [
  'Still: no effort at all beyond sitting',
  'Barely working; could chat all day',
  'Easy going; breathing unchanged',
  'Warm and working, still comfortable',
  'Working; talking in full sentences takes care',
  'Steady work; short sentences only',
  'Challenging; a few words at a time',
  'Burning; you are counting the seconds',
  'Shaking; only a little left in reserve',
  'At the edge; form is about to slip',
  'Could not hold one second longer',
]

/** The anchor words for a rating; a rating between steps takes the nearest lower step. */
export function effortAnchor(rating: number): string {
  if (!Number.isFinite(rating) || rating < 0 || rating > 10) throw new RangeError('An effort rating runs from 0 to 10.')
  return EFFORT_ANCHORS[Math.floor(rating)]!
}

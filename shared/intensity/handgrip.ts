/** Target force for a handgrip hold: a share (0–1) of the measured maximal grip, same unit, to 0.1. */
export function handgripTarget(maxGrip: number, share: number): number {
  if (!(maxGrip > 0)) throw new RangeError('The maximal grip must be more than 0.')
  if (!(share > 0 && share <= 1)) throw new RangeError('The share must be more than 0 and at most 1.')
  return Math.round(maxGrip * share * 10) / 10
}

/** The share of maximal grip (in %) that a force represents, to 0.1. */
export function mvcPercent(force: number, maxGrip: number): number {
  if (!(maxGrip > 0)) throw new RangeError('The maximal grip must be more than 0.')
  return Math.round(force / maxGrip * 1000) / 10
}

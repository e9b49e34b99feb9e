import type { BpCategory } from '../bp/classify'
import { classify, isHypertensive } from '../bp/classify'
import { homeAverage, latestReading, summarise } from '../bp/average'
import type { BlockStats, Metrics } from './metrics'
import type { ClientProfile } from './profile'
import type { Resolved, ResolvedBlock } from './resolve'
import type { Protocol } from './schema'

// The closed set of facts a rule may test. Rules name facts by path; the loader
// rejects a path that is not listed here, so a typo cannot silently disable a rule.

export type FactValue = number | string | boolean | readonly string[] | null | undefined

interface ReadingFacts { systolic: number, diastolic: number, pulse: number | null, category: BpCategory }

/** What rules can know about the client, worked out once per analysis. */
export interface ProfileFacts {
  latest: ReadingFacts | null
  average: ReadingFacts | null
  home: ReadingFacts | null
  highBloodPressure: boolean
  conditions: readonly string[]
  medications: readonly string[]
  injuredRegions: readonly string[]
  cleared: boolean
}

export interface FactContext {
  protocol: Protocol
  resolved: Resolved
  metrics: Metrics
  stats: BlockStats
  profile: ProfileFacts | null
  track: number
  index: number
  block: ResolvedBlock | null
}

/** Derives the profile facts: latest, averaged and home readings with categories, clearance. */
export function profileFacts(profile: ClientProfile): ProfileFacts {
  const guideline = profile.guideline
  const readings = profile.readings ?? []
  const latest = latestReading(readings)
  const average = summarise(readings, guideline)
  const home = homeAverage(readings, guideline)
  const latestFacts = latest ? { systolic: latest.systolic, diastolic: latest.diastolic, pulse: latest.pulse ?? null, category: classify(latest.systolic, latest.diastolic, guideline) } : null
  const averageFacts = average ? { systolic: average.systolic, diastolic: average.diastolic, pulse: average.pulse, category: average.category } : null
  const homeFacts = home.status === 'ok' ? { systolic: home.systolic, diastolic: home.diastolic, pulse: home.pulse, category: home.category } : null
  // Clearance counts only if it is not older than the latest reading.
  const clearance = profile.clearance
  const cleared = !!clearance && (!latest?.takenAt || Date.parse(clearance.givenAt) >= Date.parse(latest.takenAt))
  return {
    latest: latestFacts,
    average: averageFacts,
    home: homeFacts,
    highBloodPressure: [latestFacts, averageFacts, homeFacts].some(r => r !== null && isHypertensive(r.category)),
    conditions: profile.conditions ?? [],
    medications: profile.medications ?? [],
    injuredRegions: profile.injuredRegions ?? [],
    cleared,
  }
}

type Accessor = (c: FactContext) => FactValue

const reading = (pick: (p: ProfileFacts) => ReadingFacts | null, key: keyof ReadingFacts): Accessor =>
  c => c.profile ? pick(c.profile)?.[key] ?? null : null

function intersect(a: readonly string[], b: readonly string[]): string[] {
  return a.filter(x => b.includes(x))
}

function targetKeys(block: ResolvedBlock): string[] {
  return block.kind === 'hold' && block.src.target ? Object.keys(block.src.target).filter(k => block.src.target![k as keyof typeof block.src.target] !== undefined) : []
}

const holdRange = (key: 'sets' | 'hold' | 'rest' | 'kneeAngle' | 'mvcPercent' | 'effort', end: 'min' | 'max'): Accessor =>
  c => c.block?.kind === 'hold' ? c.block.lib?.ranges[key]?.[end] ?? null : c.block?.kind === 'rest' && key === 'rest' ? c.block.lib?.ranges.rest[end] ?? null : null

/** Rest as a share of the hold before it: between sets for a hold, or after the previous hold for a rest block. */
function restShare(c: FactContext): number | null {
  const block = c.block
  if (!block) return null
  if (block.kind === 'hold') return block.sets > 1 && block.hold > 0 ? block.rest / block.hold : null
  if (block.kind === 'rest' && c.index > 0) {
    const before = c.resolved.tracks[c.track]!.blocks[c.index - 1]!
    return before.kind === 'hold' && before.hold > 0 ? block.rest / before.hold : null
  }
  return null
}

const FACTS = {
  'profile.present': c => c.profile !== null,
  'profile.latest.systolic': reading(p => p.latest, 'systolic'),
  'profile.latest.diastolic': reading(p => p.latest, 'diastolic'),
  'profile.latest.pulse': reading(p => p.latest, 'pulse'),
  'profile.latest.category': reading(p => p.latest, 'category'),
  'profile.average.systolic': reading(p => p.average, 'systolic'),
  'profile.average.diastolic': reading(p => p.average, 'diastolic'),
  'profile.average.category': reading(p => p.average, 'category'),
  'profile.home.systolic': reading(p => p.home, 'systolic'),
  'profile.home.diastolic': reading(p => p.home, 'diastolic'),
  'profile.home.category': reading(p => p.home, 'category'),
  'profile.highBloodPressure': c => c.profile?.highBloodPressure ?? null,
  'profile.conditions': c => c.profile?.conditions ?? null,
  'profile.medications': c => c.profile?.medications ?? null,
  'profile.injuredRegions': c => c.profile?.injuredRegions ?? null,
  'profile.cleared': c => c.profile?.cleared ?? null,

  'metrics.sessionSeconds': c => c.metrics.sessionSeconds,
  'metrics.tensionSeconds': c => c.metrics.tensionSeconds,
  'metrics.restSeconds': c => c.metrics.restSeconds,
  'metrics.workRestRatio': c => c.metrics.workRestRatio,
  'metrics.breathsPerMinute': c => c.metrics.breathsPerMinute,
  'metrics.retentionUnderTensionSeconds': c => c.metrics.retentionUnderTensionSeconds,
  'metrics.longestRetentionUnderTensionSeconds': c => c.metrics.longestRetentionUnderTensionSeconds,
  'metrics.sessionsPerWeek': c => c.metrics.sessionsPerWeek,
  'metrics.weeklyTensionSeconds': c => c.metrics.weeklyTensionSeconds,
  'metrics.weeklySessionSeconds': c => c.metrics.weeklySessionSeconds,

  'targets.tensionSeconds.min': c => c.protocol.targets?.tensionSeconds?.min ?? null,
  'targets.tensionSeconds.max': c => c.protocol.targets?.tensionSeconds?.max ?? null,
  'targets.weeklyTensionSeconds.min': c => c.protocol.targets?.weeklyTensionSeconds?.min ?? null,
  'targets.weeklyTensionSeconds.max': c => c.protocol.targets?.weeklyTensionSeconds?.max ?? null,

  'block.kind': c => c.block?.kind ?? null,
  'block.id': c => c.block?.lib?.id ?? null,
  'block.name': c => c.block?.lib?.name ?? null,
  'block.sets': c => c.block?.kind === 'hold' ? c.block.sets : null,
  'block.hold': c => c.block?.kind === 'hold' ? c.block.hold : null,
  'block.rest': c => c.block?.kind === 'hold' || c.block?.kind === 'rest' ? c.block.rest : null,
  'block.restShare': restShare,
  'block.tensionSeconds': c => c.block?.kind === 'hold' ? c.block.sets * c.block.hold : null,
  'block.regions': c => c.block?.kind === 'hold' ? c.block.lib?.regions ?? [] : [],
  'block.contraindications': c => c.block?.lib?.contraindications ?? [],
  'block.conditionsFlagged': c => intersect(c.block?.lib?.contraindications ?? [], c.profile?.conditions ?? []),
  'block.injuredRegions': c => c.block?.kind === 'hold' ? intersect(c.block.lib?.regions ?? [], c.profile?.injuredRegions ?? []) : [],
  'block.gradedBy': c => c.block?.kind === 'hold' ? c.block.lib?.gradedBy ?? [] : [],
  'block.targets': c => c.block ? targetKeys(c.block) : [],
  'block.target.kneeAngle': c => c.block?.kind === 'hold' ? c.block.src.target?.kneeAngle ?? null : null,
  'block.target.mvcPercent': c => c.block?.kind === 'hold' ? c.block.src.target?.mvcPercent ?? null : null,
  'block.target.effort': c => c.block?.kind === 'hold' ? c.block.src.target?.effort ?? null : null,
  'block.target.heartRate': c => c.block?.kind === 'hold' ? c.block.src.target?.heartRate ?? null : null,
  'block.range.sets.min': holdRange('sets', 'min'),
  'block.range.sets.max': holdRange('sets', 'max'),
  'block.range.hold.min': holdRange('hold', 'min'),
  'block.range.hold.max': holdRange('hold', 'max'),
  'block.range.rest.min': holdRange('rest', 'min'),
  'block.range.rest.max': holdRange('rest', 'max'),
  'block.range.kneeAngle.min': holdRange('kneeAngle', 'min'),
  'block.range.kneeAngle.max': holdRange('kneeAngle', 'max'),
  'block.range.mvcPercent.min': holdRange('mvcPercent', 'min'),
  'block.range.mvcPercent.max': holdRange('mvcPercent', 'max'),
  'block.range.duration.min': c => c.block?.kind === 'breath' ? c.block.lib?.ranges.duration.min ?? null : null,
  'block.range.duration.max': c => c.block?.kind === 'breath' ? c.block.lib?.ranges.duration.max ?? null : null,
  'block.duration': c => c.block?.kind === 'breath' && c.block.tieTrack < 0 ? c.block.length : null,
  'block.tied': c => c.block?.kind === 'breath' ? c.block.tieTrack >= 0 : null,
  'block.pattern.retention': c => c.block?.kind === 'breath' ? c.block.holdIn + c.block.holdOut : null,
  'block.retentionUnderTensionSeconds': c => c.block ? c.stats.retentionUnderTension[c.track]![c.index]! : null,
  'block.longestRetentionUnderTensionSeconds': c => c.block ? c.stats.longestRetentionUnderTension[c.track]![c.index]! : null,
} satisfies Record<string, Accessor>

export type FactPath = keyof typeof FACTS

/** Every fact path a rule may name. */
export const FACT_PATHS = Object.keys(FACTS) as FactPath[]

/** The accessor for a fact path, or undefined for an unknown path. */
export function factAccessor(path: string): Accessor | undefined {
  return Object.hasOwn(FACTS, path) ? FACTS[path as FactPath] : undefined
}

import type { BodyRegion, Condition, IntensityMeasure, RestKind } from '../protocol/vocabulary'

// Types of library data after blocks/block.schema.json and blocks/rule.schema.json
// accepted it. No ajv here: the studio imports these types with the engine.

/** An inclusive range of whole numbers. */
export interface Range { min: number, max: number }

interface LibraryBlockBase {
  id: string
  name: string
  summary: string
  /** Conditions for which this block calls for extra care. */
  contraindications: Condition[]
  cues?: string[]
  /** Plain-words cautions shown wherever the block is used. */
  cautions: string[]
}

export interface HoldLibraryBlock extends LibraryBlockBase {
  kind: 'hold'
  regions: BodyRegion[]
  /** How intensity is usually set; 'heart-rate' means graded from a heart-rate test. */
  gradedBy: IntensityMeasure[]
  defaults: { sets: number, hold: number, rest: number, target?: { kneeAngle?: number, mvcPercent?: number, effort?: number } }
  ranges: { sets: Range, hold: Range, rest: Range, kneeAngle?: Range, mvcPercent?: Range, effort?: Range }
}

export interface BreathLibraryBlock extends LibraryBlockBase {
  kind: 'breath'
  pattern: { inhale: number, holdIn: number, exhale: number, holdOut: number }
  defaults: { duration?: number, cycles?: number }
  ranges: { duration: Range }
}

export interface RestLibraryBlock extends LibraryBlockBase {
  kind: 'rest'
  restKind: RestKind
  defaults: { rest: number }
  ranges: { rest: Range }
}

export type LibraryBlock = HoldLibraryBlock | BreathLibraryBlock | RestLibraryBlock

/** A leaf test on one fact; `value` may name another fact as `{ fact }`. */
export interface FactTest {
  fact: string
  op: 'eq' | 'ne' | 'lt' | 'lte' | 'gt' | 'gte' | 'in' | 'includes' | 'intersects' | 'notEmpty' | 'exists'
  value?: string | number | boolean | string[] | { fact: string }
}
export type RuleCondition = FactTest | { all: RuleCondition[] } | { any: RuleCondition[] } | { not: RuleCondition }

/** Which things a rule looks at: the whole session, or each block of a kind. */
export type RuleScope = 'session' | 'hold' | 'breath' | 'rest' | 'block'

export interface Rule {
  id: string
  kind: 'timing' | 'contraindication'
  severity: 'error' | 'warning' | 'info'
  scope: RuleScope
  when: RuleCondition
  /** Plain message; `{fact.path}` is replaced by the fact's value. */
  message: string
  fix?: { message: string, set?: Record<string, string | number | boolean | { fact: string }>, unset?: string[] }
  source: string
  /** A caution specific to this rule, shown before the standard one. */
  caution?: string
}

/** The block and rule data the engine analyzes against. */
export interface Library {
  blocks: LibraryBlock[]
  rules: Rule[]
}

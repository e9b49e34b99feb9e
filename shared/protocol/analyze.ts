import type { LibraryBlock, Rule } from '../library/types'
import { profileFacts } from './facts'
import type { Finding } from './findings'
import type { Metrics } from './metrics'
import { computeMetrics } from './metrics'
import type { ClientProfile } from './profile'
import { resolveProtocol } from './resolve'
import type { Protocol } from './schema'
import type { Timeline, TimelineLimits } from './timeline'
import { timelineFromResolved } from './timeline'
import { ruleFindings, timelineFindings } from './validate'

export interface AnalyzeOptions {
  library: readonly LibraryBlock[]
  rules: readonly Rule[]
  profile?: ClientProfile
  sessionsPerWeek?: number
  limits?: TimelineLimits
}

export interface Analysis {
  timeline: Timeline
  metrics: Metrics
  findings: Finding[]
}

/**
 * Timeline, metrics and findings of a schema-valid protocol. Pure and linear in the
 * size of the timeline; never throws on a document ProtocolSchema accepts.
 */
export function analyze(protocol: Protocol, options: AnalyzeOptions): Analysis {
  const findings: Finding[] = []
  const resolved = resolveProtocol(protocol, options.library, findings)
  const timeline = timelineFromResolved(resolved, options.limits)
  timelineFindings(protocol, timeline, findings)
  const { metrics, stats } = computeMetrics(resolved, timeline, options.sessionsPerWeek)
  const profile = options.profile ? profileFacts(options.profile) : null
  ruleFindings(options.rules, { protocol, resolved, metrics, stats, profile }, findings)
  return { timeline, metrics, findings }
}

/** True when any finding is an error (save, approval and assignment are blocked). */
export function hasErrors(findings: readonly Finding[]): boolean {
  return findings.some(f => f.severity === 'error')
}

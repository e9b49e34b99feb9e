import type { LibraryBlock, Rule } from '../library/types'
import type { FactContext, ProfileFacts } from './facts'
import type { Finding } from './findings'
import type { BlockStats, Metrics } from './metrics'
import type { Resolved } from './resolve'
import { structural } from './resolve'
import { applyRule, compileRule } from './rules'
import type { Protocol } from './schema'
import type { Timeline } from './timeline'

/** Findings the timeline itself reveals: overlaps on a track and an oversized expansion. */
export function timelineFindings(protocol: Protocol, timeline: Timeline, findings: Finding[]): void {
  for (const o of timeline.overlaps) {
    const id = protocol.tracks[o.track]!.blocks[o.block]!.id
    const location = id === undefined ? { track: o.track, block: o.block } : { track: o.track, block: o.block, blockId: id }
    findings.push(structural('structure.overlap', `This block would start at ${o.start} s, but the block before it on this track runs until ${o.busyUntil} s. Blocks on one track cannot overlap.`, location,
      { message: `Move it to another breath track, or start it at ${o.busyUntil} s or later.` }))
  }
  if (timeline.truncated) {
    findings.push(structural('structure.too-large', 'The protocol expands to more intervals than the engine will compute; shorten it.', {}))
  }
}

/** Runs every rule over the session and over each block in its scope. */
export function ruleFindings(rules: readonly Rule[], input: {
  protocol: Protocol
  resolved: Resolved
  metrics: Metrics
  stats: BlockStats
  profile: ProfileFacts | null
}, findings: Finding[]): void {
  const ctx: FactContext = { ...input, track: -1, index: -1, block: null }
  const compiled = rules.map(compileRule)
  const blockRules = compiled.filter(r => r.rule.scope !== 'session')
  for (const r of compiled) if (r.rule.scope === 'session') applyRule(r, ctx, findings)
  if (blockRules.length === 0) return
  const tracks = input.resolved.tracks
  for (let t = 0; t < tracks.length; t++) {
    const blocks = tracks[t]!.blocks
    for (let b = 0; b < blocks.length; b++) {
      const block = blocks[b]!
      if (!block.lib || !block.placeable) continue // already an error; rules would only add noise
      ctx.track = t
      ctx.index = b
      ctx.block = block
      for (const r of blockRules) {
        if (r.rule.scope === 'block' || r.rule.scope === block.kind) applyRule(r, ctx, findings)
      }
    }
  }
}

/** Library blocks and rules together, as `analyze` takes them. */
export interface EngineLibrary {
  library: readonly LibraryBlock[]
  rules: readonly Rule[]
}

import { stringify } from 'yaml'
import { locate, parseYaml } from '../yaml/locate'
import type { YamlLimits } from '../yaml/locate'
import type { Protocol } from './schema'
import { ProtocolSchema } from './schema'

// YAML import and export of a protocol document, with limits against hostile input.

/** Limits for an imported protocol: 1 MiB, 50 aliases, 8 levels (a protocol needs 6). */
export const PROTOCOL_YAML_LIMITS: YamlLimits = { maxBytes: 1024 * 1024, maxAliasCount: 50, maxDepth: 8 }

/** One problem with an imported document, by dotted path and, for YAML, line. */
export interface ProtocolIssue {
  path: string
  message: string
  line?: number
  column?: number
}

export type ProtocolParse = { ok: true, protocol: Protocol } | { ok: false, issues: ProtocolIssue[] }

/** Checks a parsed value (JSON or YAML) against the protocol schema. */
export function checkProtocol(value: unknown): ProtocolParse {
  const result = ProtocolSchema.safeParse(value)
  if (result.success) return { ok: true, protocol: result.data }
  return { ok: false, issues: result.error.issues.map(i => ({ path: i.path.map(String).join('.'), message: i.message })) }
}

/** Reads a protocol from YAML; every problem comes back with its path and line. */
export function parseProtocolYaml(text: string, limits: YamlLimits = PROTOCOL_YAML_LIMITS): ProtocolParse {
  const read = parseYaml(text, limits)
  if (!read.ok) return { ok: false, issues: read.problems.map(p => ({ path: p.field, message: p.message, line: p.line, column: p.column })) }
  const result = ProtocolSchema.safeParse(read.parsed.value)
  if (result.success) return { ok: true, protocol: result.data }
  return {
    ok: false,
    issues: result.error.issues.map((i) => {
      const path = i.path.map(p => typeof p === 'symbol' ? String(p) : p)
      const keys = i.code === 'unrecognized_keys' ? i.keys : []
      const where = keys.length ? locate(read.parsed, [...path, keys[0]!], true) : locate(read.parsed, path)
      return { path: path.join('.'), message: i.message, ...where }
    }),
  }
}

/** Writes a protocol as YAML; parseProtocolYaml gives the same document back. */
export function protocolToYaml(protocol: Protocol): string {
  return stringify(protocol, { lineWidth: 0, aliasDuplicateObjects: false })
}

/** "line 4: tracks.0.blocks.0.hold: Invalid input" for messages. */
export function formatProtocolIssue(issue: ProtocolIssue): string {
  return `${issue.line ? `line ${issue.line}: ` : ''}${issue.path ? `${issue.path}: ` : ''}${issue.message}`
}

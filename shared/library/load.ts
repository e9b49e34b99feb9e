import Ajv from 'ajv'
import type { ErrorObject, ValidateFunction } from 'ajv'
import blockSchema from '../../blocks/block.schema.json'
import ruleSchema from '../../blocks/rule.schema.json'
import { factAccessor } from '../protocol/facts'
import { locate, parseYaml } from '../yaml/locate'
import type { ParsedYaml, YamlLimits } from '../yaml/locate'
import type { Library, LibraryBlock, Rule, RuleCondition } from './types'

// Loads block and rule YAML, validating each file with ajv against its JSON Schema.
// Pure: it takes file names and texts, so the server reads files and tests pass fixtures.
// Not imported by the analyze path (keeps ajv out of the studio's bundle).

/** A file to load: its name (used in messages and checked against the id) and its text. */
export interface LibraryFile { name: string, text: string }

/** One problem in one file, named by line and field. */
export interface LibraryIssue {
  file: string
  line?: number
  column?: number
  field: string
  message: string
}

/** Thrown when any library file is malformed; the message lists every problem. */
export class LibraryLoadError extends Error {
  readonly issues: LibraryIssue[]
  constructor(issues: LibraryIssue[]) {
    super(issues.map(formatIssue).join('\n'))
    this.name = 'LibraryLoadError'
    this.issues = issues
  }
}

/** "blocks/library/plank.yaml, line 4, field ranges.hold.min: must be >= 0". */
export function formatIssue(i: LibraryIssue): string {
  return `${i.file}${i.line ? `, line ${i.line}` : ''}${i.field ? `, field ${i.field}` : ''}: ${i.message}`
}

const LIMITS: YamlLimits = { maxBytes: 64 * 1024, maxAliasCount: 0, maxDepth: 16 }

let compiled: { block: ValidateFunction, rule: ValidateFunction } | undefined
function validators() {
  if (!compiled) {
    const ajv = new Ajv({ allErrors: true, strict: true, strictRequired: false, allowUnionTypes: true })
    compiled = { block: ajv.compile(blockSchema), rule: ajv.compile(ruleSchema) }
  }
  return compiled
}

function pointerToPath(pointer: string): string[] {
  return pointer === '' ? [] : pointer.slice(1).split('/').map(p => p.replace(/~1/g, '/').replace(/~0/g, '~'))
}

function describe(e: ErrorObject): { path: string[], message: string, atKey: boolean } {
  const path = pointerToPath(e.instancePath)
  const p = e.params as Record<string, unknown>
  switch (e.keyword) {
    case 'required': return { path: [...path, String(p.missingProperty)], message: 'is required', atKey: false }
    case 'additionalProperties': return { path: [...path, String(p.additionalProperty)], message: 'is not a known field', atKey: true }
    case 'enum': return { path, message: `must be one of: ${(p.allowedValues as unknown[]).join(', ')}`, atKey: false }
    case 'false schema': return { path, message: 'is not a field of this kind of block', atKey: true }
    case 'oneOf': return { path, message: 'is not a valid condition (use all, any, not, or fact with op)', atKey: false }
    default: return { path, message: e.message ?? 'is not valid', atKey: false }
  }
}

function schemaIssues(file: string, parsed: ParsedYaml, errors: ErrorObject[]): LibraryIssue[] {
  // A failed oneOf repeats every branch's complaint at the same place; keep the summary and deeper errors.
  const oneOfAt = new Set(errors.filter(e => e.keyword === 'oneOf').map(e => e.instancePath))
  const seen = new Set<string>()
  const issues: LibraryIssue[] = []
  for (const e of errors) {
    if (e.keyword === 'if') continue
    if (e.keyword !== 'oneOf' && [...oneOfAt].some(at => e.instancePath === at || (e.keyword === 'required' && e.instancePath.startsWith(at)))) continue
    const d = describe(e)
    const field = d.path.join('.')
    const key = `${field}|${d.message}`
    if (seen.has(key)) continue
    seen.add(key)
    issues.push({ file, ...locate(parsed, d.path, d.atKey), field, message: d.message })
  }
  return issues
}

function parseFile(file: LibraryFile, validate: ValidateFunction, issues: LibraryIssue[]): { value: unknown, parsed: ParsedYaml } | undefined {
  const result = parseYaml(file.text, LIMITS)
  if (!result.ok) {
    for (const p of result.problems) issues.push({ file: file.name, line: p.line, column: p.column, field: p.field, message: p.message })
    return undefined
  }
  const { parsed } = result
  if (!validate(parsed.value)) {
    issues.push(...schemaIssues(file.name, parsed, validate.errors ?? []))
    return undefined
  }
  return { value: parsed.value, parsed }
}

function baseName(name: string): string {
  return name.replace(/^.*[\\/]/, '').replace(/\.ya?ml$/, '')
}

function checkBlock(file: string, block: LibraryBlock, parsed: ParsedYaml, issues: LibraryIssue[]): void {
  const add = (path: string[], message: string) => issues.push({ file, ...locate(parsed, path), field: path.join('.'), message })
  if (block.id !== baseName(file)) add(['id'], `must match the file name ("${baseName(file)}")`)
  const ranges = block.ranges as Record<string, { min: number, max: number } | undefined>
  for (const [key, range] of Object.entries(ranges)) {
    if (range && range.min > range.max) add(['ranges', key, 'min'], `is more than ranges.${key}.max`)
  }
  const inRange = (path: string[], value: number | undefined, range: { min: number, max: number } | undefined) => {
    if (value !== undefined && range && (value < range.min || value > range.max)) add(path, `${value} is outside the allowed range ${range.min}–${range.max}`)
  }
  if (block.kind === 'hold') {
    inRange(['defaults', 'sets'], block.defaults.sets, block.ranges.sets)
    inRange(['defaults', 'hold'], block.defaults.hold, block.ranges.hold)
    inRange(['defaults', 'rest'], block.defaults.rest, block.ranges.rest)
    inRange(['defaults', 'target', 'kneeAngle'], block.defaults.target?.kneeAngle, block.ranges.kneeAngle)
    inRange(['defaults', 'target', 'mvcPercent'], block.defaults.target?.mvcPercent, block.ranges.mvcPercent)
    inRange(['defaults', 'target', 'effort'], block.defaults.target?.effort, block.ranges.effort)
  }
  else if (block.kind === 'breath') {
    const p = block.pattern
    if (p.inhale + p.holdIn + p.exhale + p.holdOut <= 0) add(['pattern'], 'a breathing cycle must last more than 0 s')
    inRange(['defaults', 'duration'], block.defaults.duration, block.ranges.duration)
  }
  else {
    inRange(['defaults', 'rest'], block.defaults.rest, block.ranges.rest)
  }
}

/** Loads and validates library blocks, one block a file; throws LibraryLoadError naming file, line and field. */
export function loadBlockLibrary(files: readonly LibraryFile[]): LibraryBlock[] {
  const { block: validate } = validators()
  const issues: LibraryIssue[] = []
  const blocks: LibraryBlock[] = []
  const ids = new Map<string, string>()
  for (const file of files) {
    const loaded = parseFile(file, validate, issues)
    if (!loaded) continue
    const block = loaded.value as LibraryBlock
    checkBlock(file.name, block, loaded.parsed, issues)
    const other = ids.get(block.id)
    if (other) issues.push({ file: file.name, ...locate(loaded.parsed, ['id']), field: 'id', message: `"${block.id}" is already used by ${other}` })
    ids.set(block.id, file.name)
    blocks.push(block)
  }
  if (issues.length) throw new LibraryLoadError(issues)
  return blocks
}

const NO_VALUE = new Set(['notEmpty', 'exists'])

function checkCondition(cond: RuleCondition, path: Array<string | number>, add: (path: Array<string | number>, message: string) => void): void {
  if ('all' in cond) return cond.all.forEach((c, i) => checkCondition(c, [...path, 'all', i], add))
  if ('any' in cond) return cond.any.forEach((c, i) => checkCondition(c, [...path, 'any', i], add))
  if ('not' in cond) return checkCondition(cond.not, [...path, 'not'], add)
  if (!factAccessor(cond.fact)) add([...path, 'fact'], `"${cond.fact}" is not a fact the engine knows`)
  if (NO_VALUE.has(cond.op) && cond.value !== undefined) add([...path, 'value'], `op ${cond.op} takes no value`)
  if (!NO_VALUE.has(cond.op) && cond.value === undefined) add([...path, 'op'], `op ${cond.op} needs a value`)
  const v = cond.value
  if (v !== null && typeof v === 'object' && !Array.isArray(v) && !factAccessor(v.fact)) add([...path, 'value', 'fact'], `"${v.fact}" is not a fact the engine knows`)
}

/** Loads and validates rule files; throws LibraryLoadError naming file, line and field. */
export function loadRules(files: readonly LibraryFile[]): Rule[] {
  const { rule: validate } = validators()
  const issues: LibraryIssue[] = []
  const rules: Rule[] = []
  const ids = new Map<string, string>()
  for (const file of files) {
    const loaded = parseFile(file, validate, issues)
    if (!loaded) continue
    const rule = loaded.value as Rule
    const add = (path: Array<string | number>, message: string) =>
      issues.push({ file: file.name, ...locate(loaded.parsed, path), field: path.join('.'), message })
    checkCondition(rule.when, ['when'], add)
    for (const [key, value] of Object.entries(rule.fix?.set ?? {})) {
      if (typeof value === 'object' && !factAccessor(value.fact)) add(['fix', 'set', key, 'fact'], `"${value.fact}" is not a fact the engine knows`)
    }
    for (const [path, text] of [[['message'], rule.message], [['fix', 'message'], rule.fix?.message ?? '']] as const) {
      for (const m of text.matchAll(/\{([a-zA-Z.]+)\}/g)) if (!factAccessor(m[1]!)) add([...path], `{${m[1]}} is not a fact the engine knows`)
    }
    const other = ids.get(rule.id)
    if (other) add(['id'], `"${rule.id}" is already used by ${other}`)
    ids.set(rule.id, file.name)
    rules.push(rule)
  }
  if (issues.length) throw new LibraryLoadError(issues)
  return rules
}

/** Loads blocks and rules together. */
export function loadLibrary(files: { blocks: readonly LibraryFile[], rules: readonly LibraryFile[] }): Library {
  const issues: LibraryIssue[] = []
  let blocks: LibraryBlock[] = []
  let rules: Rule[] = []
  try {
    blocks = loadBlockLibrary(files.blocks)
  }
  catch (error) {
    if (!(error instanceof LibraryLoadError)) throw error
    issues.push(...error.issues)
  }
  try {
    rules = loadRules(files.rules)
  }
  catch (error) {
    if (!(error instanceof LibraryLoadError)) throw error
    issues.push(...error.issues)
  }
  if (issues.length) throw new LibraryLoadError(issues)
  return { blocks, rules }
}

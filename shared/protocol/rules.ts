import type { Rule, RuleCondition } from '../library/types'
import type { FactContext, FactValue } from './facts'
import { factAccessor } from './facts'
import type { Finding, PatchOp } from './findings'
import { HEALTH_CAUTION, STANDARD_CAUTION } from './findings'

// A small, generic evaluator for rules kept as data. A rule's condition is compiled
// once into closures; evaluation never throws, and a missing fact makes a test false.

type Test = (c: FactContext) => boolean

const isList = (v: unknown): v is readonly string[] => Array.isArray(v)

function leaf(cond: Extract<RuleCondition, { fact: string }>): Test {
  const get = factAccessor(cond.fact)
  if (!get) return () => false
  const raw = cond.value
  const ref = raw !== null && typeof raw === 'object' && !Array.isArray(raw) ? factAccessor(raw.fact) : undefined
  const value = (c: FactContext): FactValue => ref ? ref(c) : raw as FactValue
  const num = (a: FactValue, b: FactValue, cmp: (x: number, y: number) => boolean) => typeof a === 'number' && typeof b === 'number' && cmp(a, b)
  switch (cond.op) {
    case 'eq': return c => { const a = get(c); return a !== null && a !== undefined && a === value(c) }
    case 'ne': return c => { const a = get(c); return a !== null && a !== undefined && a !== value(c) }
    case 'lt': return c => num(get(c), value(c), (x, y) => x < y)
    case 'lte': return c => num(get(c), value(c), (x, y) => x <= y)
    case 'gt': return c => num(get(c), value(c), (x, y) => x > y)
    case 'gte': return c => num(get(c), value(c), (x, y) => x >= y)
    case 'in': return c => { const a = get(c); const v = value(c); return typeof a === 'string' && isList(v) && v.includes(a) }
    case 'includes': return c => { const a = get(c); const v = value(c); return isList(a) && typeof v === 'string' && a.includes(v) }
    case 'intersects': return c => { const a = get(c); const v = value(c); return isList(a) && isList(v) && a.some(x => v.includes(x)) }
    case 'notEmpty': return c => { const a = get(c); return isList(a) && a.length > 0 }
    case 'exists': return c => { const a = get(c); return a !== null && a !== undefined }
    default: return () => false
  }
}

/** Compiles a condition tree into a test. */
export function compileCondition(cond: RuleCondition): Test {
  if ('all' in cond) {
    const parts = cond.all.map(compileCondition)
    return c => parts.every(p => p(c))
  }
  if ('any' in cond) {
    const parts = cond.any.map(compileCondition)
    return c => parts.some(p => p(c))
  }
  if ('not' in cond) {
    const inner = compileCondition(cond.not)
    return c => !inner(c)
  }
  return leaf(cond)
}

function show(v: FactValue): string {
  if (v === null || v === undefined) return '?'
  if (typeof v === 'number') return String(Math.round(v * 100) / 100)
  if (isList(v)) return v.join(', ')
  return String(v)
}

/** Replaces `{fact.path}` in a rule's text by the fact's value. */
export function interpolate(text: string, c: FactContext): string {
  return text.replace(/\{([a-zA-Z.]+)\}/g, (whole, path: string) => {
    const get = factAccessor(path)
    return get ? show(get(c)) : whole
  })
}

export interface CompiledRule {
  rule: Rule
  test: Test
}

const compiledCache = new WeakMap<Rule, CompiledRule>()

/** Compiles a rule once per rule object. */
export function compileRule(rule: Rule): CompiledRule {
  let compiled = compiledCache.get(rule)
  if (!compiled) {
    compiled = { rule, test: compileCondition(rule.when) }
    compiledCache.set(rule, compiled)
  }
  return compiled
}

function buildPatch(rule: Rule, c: FactContext): PatchOp[] | undefined {
  const fix = rule.fix
  if (!fix || (!fix.set && !fix.unset) || !c.block) return undefined
  const base = `/tracks/${c.track}/blocks/${c.index}`
  const src = c.block.src as unknown as Record<string, unknown>
  const ops: PatchOp[] = []
  for (const [key, raw] of Object.entries(fix.set ?? {})) {
    const value = typeof raw === 'object' ? factAccessor(raw.fact)?.(c) : raw
    if (value === null || value === undefined) return undefined // the fix cannot be worked out here
    const [head, sub] = key.split('.', 2) as [string, string | undefined]
    if (sub === undefined) ops.push({ op: head in src ? 'replace' : 'add', path: `${base}/${head}`, value })
    else if (src[head] && typeof src[head] === 'object') ops.push({ op: sub in (src[head] as object) ? 'replace' : 'add', path: `${base}/${head}/${sub}`, value })
    else ops.push({ op: 'add', path: `${base}/${head}`, value: { [sub]: value } })
  }
  for (const key of fix.unset ?? []) if (key in src) ops.push({ op: 'remove', path: `${base}/${key}` })
  return ops.length ? ops : undefined
}

/** Evaluates one compiled rule in one context, pushing a finding when it fires. */
export function applyRule(compiled: CompiledRule, c: FactContext, findings: Finding[]): void {
  if (!compiled.test(c)) return
  const rule = compiled.rule
  const finding: Finding = {
    rule: rule.id,
    severity: rule.severity,
    message: interpolate(rule.message, c),
    location: {},
    source: rule.source,
    caution: [rule.caution, rule.kind === 'contraindication' ? HEALTH_CAUTION : undefined, STANDARD_CAUTION].filter(Boolean).join(' '),
  }
  if (c.block) {
    finding.location = { track: c.track, block: c.index }
    if (c.block.src.id !== undefined) finding.location.blockId = c.block.src.id
  }
  if (rule.fix) {
    finding.fix = { message: interpolate(rule.fix.message, c) }
    const patch = buildPatch(rule, c)
    if (patch) finding.fix.patch = patch
  }
  findings.push(finding)
}

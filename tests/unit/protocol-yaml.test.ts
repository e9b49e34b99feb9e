import { describe, expect, it } from 'vitest'
import { analyze } from '../../shared/protocol/analyze'
import { parseProtocolYaml, protocolToYaml } from '../../shared/protocol/yaml'
import { repoLibrary, yamlFiles } from './support/repo-library'

const { blocks: library, rules } = repoLibrary()

const reference = `format: 1
name: Wall squat with paced breath
tracks:
  - kind: body
    blocks:
      - { kind: hold, block: wall-squat, sets: 4, hold: 120, rest: 120, target: { kneeAngle: 110, effort: 7 } }
  - kind: breath
    blocks:
      - { kind: breath, block: pattern-4-7-8, during: { track: 0, block: 0 } }
`

describe('protocol YAML import and export', () => {
  it('imports the reference document and exports it back to the same document', () => {
    const first = parseProtocolYaml(reference)
    expect(first.ok).toBe(true)
    if (!first.ok) return
    expect(parseProtocolYaml(protocolToYaml(first.protocol))).toEqual(first)
    expect(analyze(first.protocol, { library, rules }).metrics.sessionSeconds).toBe(840)
  })

  it('lists every schema problem with its path and line', () => {
    const broken = reference.replace('sets: 4', 'sets: four').replace('hold: 120, rest', 'hodl: 120, rest')
    const result = parseProtocolYaml(broken)
    expect(result.ok).toBe(false)
    if (result.ok) return
    const byPath = Object.fromEntries(result.issues.map(i => [i.path, i]))
    expect(byPath['tracks.0.blocks.0.sets']).toMatchObject({ line: 6 })
    expect(byPath['tracks.0.blocks.0.hold']).toMatchObject({ line: 6 })
    expect(result.issues.find(i => /hodl/.test(i.message))).toMatchObject({ path: 'tracks.0.blocks.0', line: 6 })
  })

  it('reports a YAML syntax error with its line', () => {
    const result = parseProtocolYaml('format: 1\nname: x\ntracks: [\n  { kind: body\n')
    expect(result.ok).toBe(false)
    if (!result.ok) expect(result.issues[0]!.line).toBeGreaterThanOrEqual(3)
  })

  it('refuses a document larger than the size limit', () => {
    const result = parseProtocolYaml(`${reference}notes: "${'x'.repeat(2000)}"\n`, { maxBytes: 1000, maxAliasCount: 50, maxDepth: 8 })
    expect(result).toMatchObject({ ok: false, issues: [{ message: expect.stringMatching(/most accepted is 1000/) }] })
  })

  it('refuses alias bombs (exponential expansion through anchors)', () => {
    const bomb = ['a: &a [x, x, x, x, x, x, x, x, x, x]', 'b: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a, *a]', 'c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b, *b]', 'd: [*c, *c, *c, *c, *c, *c, *c, *c, *c, *c]'].join('\n')
    expect(parseProtocolYaml(bomb)).toMatchObject({ ok: false, issues: [{ message: expect.stringMatching(/alias/i) }] })
  })

  it('refuses nesting deeper than the depth limit, in flow and block style, without crashing', () => {
    expect(parseProtocolYaml(`${'['.repeat(100_000)}${']'.repeat(100_000)}`)).toMatchObject({ ok: false, issues: [{ message: expect.stringMatching(/nests/) }] })
    const deepBlock = Array.from({ length: 40 }, (_, i) => `${'  '.repeat(i)}k${i}:`).join('\n') + ' 1'
    expect(parseProtocolYaml(deepBlock)).toMatchObject({ ok: false, issues: [{ message: expect.stringMatching(/nests 40 levels/) }] })
  })

  it('refuses duplicate keys', () => {
    expect(parseProtocolYaml('format: 1\nformat: 1\nname: x\ntracks: []\n')).toMatchObject({ ok: false, issues: [{ line: 2 }] })
  })
})

describe('starter protocols in blocks/starters', () => {
  const starters = yamlFiles('blocks/starters')

  it('ships three starters', () => {
    expect(starters).toHaveLength(3)
  })

  it.each(starters.map(f => [f.name, f.text]))('%s loads and analyzes with no errors', (_name, text) => {
    const parsed = parseProtocolYaml(text)
    expect(parsed.ok ? [] : parsed.issues).toEqual([])
    if (!parsed.ok) return
    const result = analyze(parsed.protocol, { library, rules, sessionsPerWeek: 3 })
    expect(result.findings.filter(f => f.severity === 'error')).toEqual([])
    expect(result.metrics.sessionSeconds).toBeGreaterThan(0)
  })

  it('the isometric starter holds no breath under tension, so clients with high blood pressure get no retention warning', () => {
    const parsed = parseProtocolYaml(starters.find(f => f.name.includes('isometric'))!.text)
    if (!parsed.ok) throw new Error('starter does not parse')
    const result = analyze(parsed.protocol, { library, rules, sessionsPerWeek: 3, profile: { conditions: ['hypertension'] } })
    expect(result.metrics.retentionUnderTensionSeconds).toBe(0)
    expect(result.findings).toEqual([])
  })
})

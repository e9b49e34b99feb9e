import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import blockSchema from '../../blocks/block.schema.json'
import { loadBlockLibrary, LibraryLoadError, loadRules } from '../../shared/library/load'
import type { LibraryIssue } from '../../shared/library/load'
import { BODY_REGIONS, CONDITIONS } from '../../shared/protocol/vocabulary'
import { repoLibrary, ROOT, yamlFiles } from './support/repo-library'

function fixture(name: string) {
  const path = `tests/unit/fixtures/${name}`
  return { name: path, text: readFileSync(join(ROOT, path), 'utf8') }
}

function issuesOf(load: () => unknown): LibraryIssue[] {
  try {
    load()
  }
  catch (error) {
    expect(error).toBeInstanceOf(LibraryLoadError)
    return (error as LibraryLoadError).issues
  }
  throw new Error('expected the load to fail')
}

describe('the block library that ships in blocks/', () => {
  const { blocks, rules } = repoLibrary()

  it('loads every block file and every rule file', () => {
    expect(blocks.length).toBe(yamlFiles('blocks/library').length)
    expect(rules.length).toBe(yamlFiles('blocks/rules').length)
  })

  it('has at least 15 blocks across holds, breathing patterns and rests', () => {
    expect(blocks.length).toBeGreaterThanOrEqual(15)
    const kinds = new Set(blocks.map(b => b.kind))
    expect([...kinds].sort()).toEqual(['breath', 'hold', 'rest'])
  })

  it('gives every block at least one caution in plain words', () => {
    for (const b of blocks) expect(b.cautions.length, b.id).toBeGreaterThan(0)
  })

  it('includes breathing patterns without breath holds for clients who should not hold the breath', () => {
    const noHold = blocks.filter(b => b.kind === 'breath' && b.pattern.holdIn === 0 && b.pattern.holdOut === 0)
    expect(noHold.length).toBeGreaterThanOrEqual(3)
  })

  it('keeps the region and condition lists of the JSON Schema the same as the shared vocabulary', () => {
    expect(blockSchema.properties.regions.items.enum).toEqual([...BODY_REGIONS])
    expect(blockSchema.properties.contraindications.items.enum).toEqual([...CONDITIONS])
  })

  it('carries at least the four contraindication rules: crisis/threshold pressure, breath held under load, beta-blockers, injuries', () => {
    const ids = rules.map(r => r.id)
    for (const id of ['bp.crisis-needs-clearance', 'bp.above-exercise-threshold', 'breath.retention-under-load', 'intensity.heart-rate-on-beta-blocker', 'injury.loads-injured-region']) {
      expect(ids).toContain(id)
    }
    for (const r of rules) expect(r.source.length, r.id).toBeGreaterThan(5)
  })
})

describe('a malformed library file fails loading with file, line and field', () => {
  it('names a value below its minimum', () => {
    const [issue, ...more] = issuesOf(() => loadBlockLibrary([fixture('bad-block-range.yaml')]))
    expect(more).toEqual([])
    expect(issue).toMatchObject({ file: 'tests/unit/fixtures/bad-block-range.yaml', line: 12, field: 'ranges.hold.min' })
    expect(issue!.message).toMatch(/>= 0/)
  })

  it('names a misspelt field at its own line', () => {
    const issues = issuesOf(() => loadBlockLibrary([fixture('bad-block-unknown-field.yaml')]))
    expect(issues).toContainEqual(expect.objectContaining({ line: 10, field: 'cautoins', message: 'is not a known field' }))
    expect(issues).toContainEqual(expect.objectContaining({ field: 'cautions', message: 'is required' }))
  })

  it('names a body region that is not in the list', () => {
    const issues = issuesOf(() => loadBlockLibrary([fixture('bad-block-region.yaml')]))
    expect(issues).toEqual([expect.objectContaining({ line: 7, field: 'regions.1' })])
    expect(issues[0]!.message).toMatch(/must be one of: neck/)
  })

  it('names the line of a YAML syntax error', () => {
    const issues = issuesOf(() => loadBlockLibrary([fixture('bad-block-syntax.yaml')]))
    expect(issues[0]).toMatchObject({ file: 'tests/unit/fixtures/bad-block-syntax.yaml' })
    expect(issues[0]!.line).toBeGreaterThanOrEqual(4)
  })

  it('names a default outside the block\'s own range', () => {
    const issues = issuesOf(() => loadBlockLibrary([fixture('bad-block-default.yaml')]))
    expect(issues).toEqual([expect.objectContaining({ line: 7, field: 'defaults.duration' })])
  })

  it('names a rule fact the engine does not know', () => {
    const issues = issuesOf(() => loadRules([fixture('bad-rule-fact.yaml')]))
    expect(issues).toEqual([expect.objectContaining({ file: 'tests/unit/fixtures/bad-rule-fact.yaml', line: 8, field: 'when.all.1.fact' })])
  })

  it('names an unknown operator in a rule', () => {
    const issues = issuesOf(() => loadRules([fixture('bad-rule-op.yaml')]))
    expect(issues).toContainEqual(expect.objectContaining({ line: 7, field: 'when.op' }))
  })

  it('puts file, line and field in the error message itself', () => {
    expect(() => loadBlockLibrary([fixture('bad-block-range.yaml')])).toThrow('tests/unit/fixtures/bad-block-range.yaml, line 12, field ranges.hold.min')
  })

  it('rejects a block whose id does not match its file name, and a duplicate id', () => {
    const text = readFileSync(join(ROOT, 'blocks/library/plank.yaml'), 'utf8')
    const issues = issuesOf(() => loadBlockLibrary([{ name: 'a/plank.yaml', text }, { name: 'b/plank.yaml', text }, { name: 'c/planks.yaml', text }]))
    expect(issues).toContainEqual(expect.objectContaining({ file: 'b/plank.yaml', line: 1, field: 'id', message: expect.stringMatching(/already used by a\/plank\.yaml/) }))
    expect(issues).toContainEqual(expect.objectContaining({ file: 'c/planks.yaml', line: 1, field: 'id', message: expect.stringMatching(/match the file name/) }))
  })
})

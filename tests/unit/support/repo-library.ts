import { readdirSync, readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { join } from 'node:path'
import { loadLibrary } from '../../../shared/library/load'
import type { LibraryFile } from '../../../shared/library/load'
import type { Library } from '../../../shared/library/types'

/** The repository root, from this file's place in tests/unit/support. */
export const ROOT = fileURLToPath(new URL('../../../', import.meta.url))

/** Every .yaml file of a folder under the repository root, named by its repo path. */
export function yamlFiles(dir: string): LibraryFile[] {
  return readdirSync(join(ROOT, dir)).filter(f => f.endsWith('.yaml')).sort()
    .map(f => ({ name: `${dir}/${f}`, text: readFileSync(join(ROOT, dir, f), 'utf8') }))
}

let cached: Library | undefined
/** The block library and rules that ship in blocks/. */
export function repoLibrary(): Library {
  cached ??= loadLibrary({ blocks: yamlFiles('blocks/library'), rules: yamlFiles('blocks/rules') })
  return cached
}

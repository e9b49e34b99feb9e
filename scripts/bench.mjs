#!/usr/bin/env node
// `npm run bench`: the speed benchmarks. `npm run bench -- engine` runs one of them.
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import { ROOT, ensureDependencies, run } from './lib/setup.mjs'

ensureDependencies()
const all = ['engine', 'studio']
const wanted = process.argv.slice(2).filter(a => all.includes(a))
for (const name of wanted.length ? wanted : all) {
  const file = join(ROOT, 'bench', `${name}.ts`)
  if (!existsSync(file)) throw new Error(`No benchmark at bench/${name}.ts`)
  console.log(`\n== bench/${name}.ts ==`)
  run(process.execPath, ['--import', 'jiti/register', file])
}

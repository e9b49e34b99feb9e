#!/usr/bin/env node
// `npm test`: installs what is missing (dependencies, PostgreSQL, Chromium), runs the whole
// suite, and ends with `N passed, N failed` counted from vitest's JSON results.
import { existsSync, readFileSync, rmSync, mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { spawnSync } from 'node:child_process'
import { ROOT, ensureBuilt, ensureDependencies, run } from './lib/setup.mjs'

const log = line => console.log(`[test] ${line}`)
const started = Date.now()

ensureDependencies(log)
const { ensurePostgres } = await import('./lib/postgres.mjs')
ensurePostgres(log)

const chromium = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
if (!existsSync(chromium)) {
  if (process.getuid?.() !== 0) throw new Error(`Chromium is missing at ${chromium}: install it with sudo apt-get install -y chromium`)
  log('Installing Chromium from Debian packages (apt-get install chromium)…')
  run('apt-get', ['update', '-qq'])
  run('apt-get', ['install', '-y', '-qq', 'chromium'], { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } })
}

log('Type-checking (nuxt typecheck)…')
run(process.execPath, [join(ROOT, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'typecheck'])

// Built once here so the suite's own setup finds it fresh; CI always builds from scratch.
ensureBuilt(log, { force: process.env.CI === 'true' })

const resultsDir = join(ROOT, '.data')
mkdirSync(resultsDir, { recursive: true })
const resultsFile = join(resultsDir, 'test-results.json')
rmSync(resultsFile, { force: true })
const vitest = spawnSync(process.execPath, [
  join(ROOT, 'node_modules', 'vitest', 'vitest.mjs'), 'run',
  '--reporter=default', '--reporter=json', `--outputFile.json=${resultsFile}`,
  ...process.argv.slice(2),
], { cwd: ROOT, stdio: 'inherit' })

let summary = 'no test results were written (the run ended before any test finished)'
let passed = 0
let failed = 0
if (existsSync(resultsFile)) {
  const results = JSON.parse(readFileSync(resultsFile, 'utf8'))
  passed = results.numPassedTests
  failed = results.numFailedTests + (results.numFailedTestSuites ?? 0)
  const skipped = results.numPendingTests + results.numTodoTests
  summary = `${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`
  if (results.numTotalTests === 0) summary = 'ran no test: 0 passed, 0 failed'
}
log(`Finished in ${((Date.now() - started) / 1000).toFixed(1)} s.`)
console.log(summary)
process.exit(vitest.status === 0 && failed === 0 && passed > 0 ? 0 : 1)

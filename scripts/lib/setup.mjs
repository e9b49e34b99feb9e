// Steps shared by `npm start` and `npm test`. Node built-ins only until dependencies exist.
import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

export const ROOT = resolve(fileURLToPath(new URL('../..', import.meta.url)))

/** The local development session password: long enough for nuxt-auth-utils, never for production. */
/** Where `nuxt build` writes the server (LAMINA_OUTPUT_DIR overrides .output). */
export const OUTPUT_DIR = resolve(ROOT, process.env.LAMINA_OUTPUT_DIR || '.output')

export const DEV_SESSION_PASSWORD = 'lamina-local-development-only-session-password-0001'

export function run(cmd, args, options = {}) {
  const result = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', ...options })
  if (result.error) throw result.error
  if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} exited with ${result.status}`)
  return result
}

/** Installs dependencies from package-lock.json when node_modules is missing or older than the lock. */
export function ensureDependencies(log = console.log) {
  const marker = join(ROOT, 'node_modules', '.package-lock.json')
  const lock = join(ROOT, 'package-lock.json')
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return false
  log('Installing dependencies (npm ci)…')
  run('npm', ['ci', '--no-audit', '--no-fund'])
  return true
}

function newestMtime(path) {
  if (!existsSync(path)) return 0
  const stat = statSync(path)
  if (!stat.isDirectory()) return stat.mtimeMs
  let newest = stat.mtimeMs
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)))
  return newest
}

const BUILD_INPUTS = ['app', 'server', 'shared', 'blocks', 'public', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json']

/** Builds the app into .output unless the build there is newer than every source file. */
export function ensureBuilt(log = console.log, { force = false } = {}) {
  const stamp = join(OUTPUT_DIR, 'nitro.json')
  const built = existsSync(stamp) ? statSync(stamp).mtimeMs : 0
  const sources = Math.max(...BUILD_INPUTS.map(p => newestMtime(join(ROOT, p))))
  if (!force && built > sources) return false
  log('Building the app (nuxt build)…')
  const started = Date.now()
  run(process.execPath, [join(ROOT, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'build'], {
    env: { ...process.env, NUXT_TELEMETRY_DISABLED: '1' },
  })
  log(`Built in ${((Date.now() - started) / 1000).toFixed(1)} s.`)
  return true
}

/** Migrates, and seeds the demo practice once unless `seed` is false. */
export function setUpDatabase(databaseUrl, { seed = true } = {}) {
  run(process.execPath, ['--import', 'jiti/register', join(ROOT, 'scripts', 'db-setup.ts'), ...(seed ? [] : ['--no-seed'])], {
    env: { ...process.env, DATABASE_URL: databaseUrl },
  })
}

#!/usr/bin/env node
// `npm start`: everything from a fresh clone to a served app, and a clean stop on Ctrl-C.
import { spawn } from 'node:child_process'
import { join } from 'node:path'
import { DEV_SESSION_PASSWORD, OUTPUT_DIR, ROOT, ensureBuilt, ensureDependencies, setUpDatabase } from './lib/setup.mjs'

const started = Date.now()
const dev = process.argv.includes('--dev')
const log = (...args) => console.log('[lamina]', ...args)

ensureDependencies(log)
const { cluster } = await import('./lib/postgres.mjs')

const port = Number(process.env.PORT || 3000)
const host = process.env.HOST || '127.0.0.1'
let pg = null
let databaseUrl = process.env.DATABASE_URL
if (!databaseUrl) {
  pg = cluster({ dir: join(ROOT, '.data', 'pg'), port: Number(process.env.LAMINA_PG_PORT || 54320), log })
  if (pg.init()) log(`Created a private PostgreSQL cluster in ${pg.dataDir}`)
  await pg.start()
  pg.createDatabase('lamina')
  databaseUrl = pg.url('lamina')
  log(`PostgreSQL is running on 127.0.0.1:${pg.port} (data in .data/pg)`)
}
else {
  log('Using the database in DATABASE_URL')
}

const { startMailFake } = await import('./lib/mail-fake.mjs')
const mail = process.env.SMTP_URL ? null : await startMailFake({ dir: join(ROOT, '.data', 'mail'), port: Number(process.env.LAMINA_SMTP_PORT || 2525) })
if (mail) log(`Local mail catcher on smtp://127.0.0.1:${mail.port} (messages at /dev/mail)`)

setUpDatabase(databaseUrl)
if (!dev) ensureBuilt(log)

const env = {
  ...process.env,
  PORT: String(port),
  HOST: host,
  NITRO_PORT: String(port),
  NITRO_HOST: host,
  DATABASE_URL: databaseUrl,
  NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD || DEV_SESSION_PASSWORD,
  LAMINA_LOCAL: '1',
  SMTP_URL: process.env.SMTP_URL || `smtp://127.0.0.1:${mail.port}`,
  LAMINA_MAIL_DIR: mail ? mail.dir : '',
  NUXT_PUBLIC_BASE_URL: process.env.NUXT_PUBLIC_BASE_URL || `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`,
}
const command = dev
  ? [join(ROOT, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'dev', '--port', String(port), '--host', host]
  : [join(OUTPUT_DIR, 'server', 'index.mjs')]
// Its own process group, so Ctrl-C reaches only this script, which stops the app first and PostgreSQL after.
const app = spawn(process.execPath, command, { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'inherit'], detached: true })

let announced = false
app.stdout.on('data', (chunk) => {
  process.stdout.write(chunk)
  if (!announced && /Listening|Local:/i.test(String(chunk))) {
    announced = true
    log(`Lamina is ready at ${env.NUXT_PUBLIC_BASE_URL} (${((Date.now() - started) / 1000).toFixed(1)} s). Ctrl-C stops it.`)
  }
})

let stopping = false
async function stop(signal, code = 0) {
  if (stopping) return
  stopping = true
  log(`${signal}: stopping the app…`)
  if (app.exitCode === null) {
    app.kill('SIGTERM')
    await new Promise(resolve => app.once('exit', resolve))
  }
  await mail?.close()
  if (pg) {
    log('Stopping PostgreSQL…')
    pg.stop()
  }
  log('Stopped.')
  process.exit(code)
}
process.on('SIGINT', () => stop('SIGINT'))
process.on('SIGTERM', () => stop('SIGTERM'))
app.on('exit', (code) => {
  if (!stopping) {
    log(`The app exited (code ${code}).`)
    stop('exit', code ?? 1)
  }
})

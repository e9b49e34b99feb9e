// A throwaway Lamina in a folder of its own: a PostgreSQL cluster, a migrated and seeded
// database, optionally the mail catcher, and the built app on a free port. Used by the
// integration tests' global setup and by the studio benchmark.
import { spawn } from 'node:child_process'
import { rmSync } from 'node:fs'
import { join } from 'node:path'
import { openDatabase } from '../../server/db/client'
import { hashPasswordOffline } from '../../server/db/hash'
import { applyMigrations } from '../../server/db/migrate'
import { seedDemo } from '../../server/db/seed'
// @ts-expect-error plain ESM helpers shared with the start script
import { cluster, waitForPort } from '../../scripts/lib/postgres.mjs'
// @ts-expect-error plain ESM helpers shared with the start script
import { DEV_SESSION_PASSWORD, OUTPUT_DIR, ROOT, ensureBuilt } from '../../scripts/lib/setup.mjs'
// @ts-expect-error plain ESM helpers shared with the start script
import { startMailFake } from '../../scripts/lib/mail-fake.mjs'
import { freePort, freePortFrom } from './ports'

export interface Stack {
  baseUrl: string
  databaseUrl: string
  adminDatabaseUrl: string
  mailDir: string
  pgDir: string
  pgPort: number
  stop: () => Promise<void>
}

/** Starts everything under `dir` (wiped first and removed by `stop`); the cluster takes `pgPort` or the next free port. */
export async function startStack({ dir, database, pgPort, mail = true, log = () => {} }: {
  dir: string
  database: string
  pgPort?: number
  mail?: boolean
  log?: (line: string) => void
}): Promise<Stack> {
  const pg = cluster({ dir: join(dir, 'pg'), port: pgPort ? await freePortFrom(pgPort) : await freePort(), log: () => {} })
  pg.destroy()
  pg.init()
  await pg.start()
  pg.createDatabase(database)
  const databaseUrl: string = pg.url(database)

  const { db, close } = openDatabase(databaseUrl)
  await applyMigrations(db)
  await seedDemo(db, hashPasswordOffline)
  await close()

  const catcher = mail ? await startMailFake({ dir: join(dir, 'mail'), clear: true }) : null
  ensureBuilt(log)

  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  const app = spawn(process.execPath, [join(OUTPUT_DIR, 'server', 'index.mjs')], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: DEV_SESSION_PASSWORD,
      LAMINA_LOCAL: '1',
      ...(catcher ? { SMTP_URL: `smtp://127.0.0.1:${catcher.port}`, LAMINA_MAIL_DIR: catcher.dir } : {}),
      NUXT_PUBLIC_BASE_URL: baseUrl,
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  })
  await waitForPort(port, 30_000)

  return {
    baseUrl,
    databaseUrl,
    adminDatabaseUrl: pg.url('postgres'),
    mailDir: catcher?.dir ?? '',
    pgDir: pg.dataDir,
    pgPort: pg.port,
    async stop() {
      if (app.exitCode === null) {
        app.kill('SIGTERM')
        await new Promise(resolve => app.once('exit', resolve))
      }
      await catcher?.close()
      pg.destroy()
      rmSync(dir, { recursive: true, force: true })
    },
  }
}

// Starts what the integration tests need, all private to the test run: a throwaway
// PostgreSQL cluster (never the user's .data/pg), the mail catcher, and the built app.
import { spawn, type ChildProcess } from 'node:child_process'
import { rmSync } from 'node:fs'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
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

// A folder per run, so two checkouts' (or two people's) runs never share a cluster.
const RUN_DIR = join(ROOT, '.data', 'test-runs', String(process.pid))

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    databaseUrl: string
    adminDatabaseUrl: string
    mailDir: string
    pgDir: string
    pgPort: number
  }
}

let app: ChildProcess | undefined

export default async function setup(project: TestProject) {
  const pgPort = Number(process.env.LAMINA_TEST_PG_PORT || 54329)
  const pg = cluster({ dir: join(RUN_DIR, 'pg'), port: await freePortFrom(pgPort), log: () => {} })
  pg.destroy()
  pg.init()
  await pg.start()
  pg.createDatabase('lamina_test')
  const databaseUrl = pg.url('lamina_test')

  const { db, close } = openDatabase(databaseUrl)
  await applyMigrations(db)
  await seedDemo(db, hashPasswordOffline)
  await close()

  const mail = await startMailFake({ dir: join(RUN_DIR, 'mail'), clear: true })
  ensureBuilt((line: string) => console.log(`[test setup] ${line}`))

  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  app = spawn(process.execPath, [join(OUTPUT_DIR, 'server', 'index.mjs')], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: DEV_SESSION_PASSWORD,
      LAMINA_LOCAL: '1',
      SMTP_URL: `smtp://127.0.0.1:${mail.port}`,
      LAMINA_MAIL_DIR: mail.dir,
      NUXT_PUBLIC_BASE_URL: baseUrl,
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  })
  await waitForPort(port, 30_000)

  project.provide('baseUrl', baseUrl)
  project.provide('databaseUrl', databaseUrl)
  project.provide('adminDatabaseUrl', pg.url('postgres'))
  project.provide('mailDir', mail.dir)
  project.provide('pgDir', pg.dataDir)
  project.provide('pgPort', pg.port)

  return async () => {
    if (app && app.exitCode === null) {
      app.kill('SIGTERM')
      await new Promise(resolve => app!.once('exit', resolve))
    }
    await mail.close()
    pg.destroy()
    rmSync(RUN_DIR, { recursive: true, force: true })
  }
}

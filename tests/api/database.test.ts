import { readdirSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { afterAll, describe, expect, inject, it } from 'vitest'
import { openDatabase } from '../../server/db/client'
import { hashPasswordOffline } from '../../server/db/hash'
import { applyMigrations } from '../../server/db/migrate'
import { DEMO_PEOPLE } from '../../server/db/demo'
import { seedDemo } from '../../server/db/seed'
import * as tables from '../../server/db/schema'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))

// Each test gets an empty database of its own on the throwaway test cluster.
async function freshDatabase(name: string) {
  const admin = openDatabase(inject('adminDatabaseUrl'), { max: 1 })
  await admin.client.unsafe(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)
  await admin.client.unsafe(`CREATE DATABASE "${name}"`)
  await admin.close()
  return openDatabase(inject('adminDatabaseUrl').replace(/\/postgres$/, `/${name}`), { max: 2 })
}

const opened: Array<{ close: () => Promise<void> }> = []
afterAll(async () => { await Promise.all(opened.map(h => h.close())) })

describe('database', () => {
  it('applies the committed migrations to an empty database and creates every table', async () => {
    const handle = await freshDatabase('lamina_migrations_check')
    opened.push(handle)
    await applyMigrations(handle.db)
    const rows = await handle.db.execute<{ table_name: string }>(sql`
      SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY table_name`)
    const names = rows.map(r => r.table_name)
    for (const table of ['practices', 'users', 'memberships', 'invitations', 'password_resets', 'rate_limits',
      'audit_events', 'templates', 'template_drafts', 'template_versions']) {
      expect(names).toContain(table)
    }
    // A second run finds nothing left to apply and changes nothing.
    await applyMigrations(handle.db)
    const again = await handle.db.execute(sql`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`)
    expect(again[0]!.n).toBeGreaterThan(0)
  })

  it('seeds the demo practice once: a second seed adds no rows', async () => {
    const handle = await freshDatabase('lamina_seed_check')
    opened.push(handle)
    await applyMigrations(handle.db)
    const count = async () => ({
      practices: (await handle.db.select().from(tables.practices)).length,
      users: (await handle.db.select().from(tables.users)).length,
      memberships: (await handle.db.select().from(tables.memberships)).length,
      templates: (await handle.db.select().from(tables.templates)).length,
      drafts: (await handle.db.select().from(tables.templateDrafts)).length,
    })
    expect(await seedDemo(handle.db, hashPasswordOffline)).toBe('seeded')
    const first = await count()
    const starters = readdirSync(join(ROOT, 'blocks', 'starters')).filter(f => f.endsWith('.yaml')).length
    expect(first).toEqual({ practices: 1, users: DEMO_PEOPLE.length, memberships: DEMO_PEOPLE.length, templates: starters, drafts: starters })
    expect(await seedDemo(handle.db, hashPasswordOffline)).toBe('already-seeded')
    expect(await count()).toEqual(first)
  })

  it('never seeds the demo over a database that already holds a practice', async () => {
    const handle = await freshDatabase('lamina_seed_real_data')
    opened.push(handle)
    await applyMigrations(handle.db)
    await handle.db.insert(tables.practices).values({ name: 'A real practice', slug: 'real-practice' })
    expect(await seedDemo(handle.db, hashPasswordOffline)).toBe('skipped-real-data')
    expect((await handle.db.select().from(tables.users)).length).toBe(0)
  })
})

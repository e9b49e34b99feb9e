import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/postgres-js/migrator'
import type { Database } from './client'

/** drizzle/ at the repository root, wherever this module is run from. */
export const MIGRATIONS_FOLDER = fileURLToPath(new URL('../../drizzle', import.meta.url))

/** Applies every committed migration not yet applied; safe to run on every start. */
export async function applyMigrations(db: Database, migrationsFolder = MIGRATIONS_FOLDER) {
  await migrate(db, { migrationsFolder })
}

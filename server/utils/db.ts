import { openDatabase, type Database } from '../db/client'

let handle: ReturnType<typeof openDatabase> | undefined

/** The app's Drizzle handle, opened on first use from DATABASE_URL. */
export function useDb(): Database {
  handle ??= openDatabase()
  return handle.db
}

/** The underlying postgres.js client (for health checks and shutdown). */
export function useSql() {
  handle ??= openDatabase()
  return handle.client
}

/** Closes the pool (Nitro's close hook). */
export async function closeDb() {
  const current = handle
  handle = undefined
  await current?.close()
}

export * as tables from '../db/schema'

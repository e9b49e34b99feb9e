import { and, eq, type SQL } from 'drizzle-orm'
import type { PgColumn } from 'drizzle-orm/pg-core'
import type { MemberContext } from './auth'

/** `practice_id = <caller's practice>`: every query on practice rows carries it. */
export function inPractice(column: PgColumn, context: Pick<MemberContext, 'practice'>): SQL {
  return eq(column, context.practice.id)
}

/** `id = <id> AND practice_id = <caller's practice>`. */
export function rowInPractice(table: { id: PgColumn, practiceId: PgColumn }, id: string, context: Pick<MemberContext, 'practice'>): SQL {
  return and(eq(table.id, id), eq(table.practiceId, context.practice.id))!
}

/**
 * The 404 for a row that does not exist *or* belongs to another practice: the same
 * status and body either way, so a caller learns nothing about other practices.
 */
export function notFound(what: string) {
  return createError({ status: 404, message: `No ${what} with that id in this practice.` })
}

/** Returns the single row of a scoped query or throws notFound. */
export function oneOr404<T>(rows: T[], what: string): T {
  const [row] = rows
  if (!row) throw notFound(what)
  return row
}

import { and, eq, ne } from 'drizzle-orm'
import { memberships } from '../db/schema'
import type { Database } from '../db/client'

type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

/**
 * Throws 409 when taking `membershipId` out of the owner role would leave the practice with
 * no owner. Locks the practice's owner rows, so two owners cannot demote each other at once.
 */
export async function keepAnOwner(tx: Tx, practiceId: string, membershipId: string) {
  const others = await tx.select({ id: memberships.id }).from(memberships)
    .where(and(eq(memberships.practiceId, practiceId), eq(memberships.role, 'owner'), ne(memberships.id, membershipId)))
    .for('update')
  if (!others.length) {
    throw createError({ status: 409, message: 'A practice needs at least one owner. Make someone else an owner first.' })
  }
}

/** Locks one membership row of the caller's practice, or 404s (other practices' rows included). */
export async function lockMembership(tx: Tx, practiceId: string, membershipId: string) {
  const [row] = await tx.select().from(memberships)
    .where(and(eq(memberships.id, membershipId), eq(memberships.practiceId, practiceId)))
    .for('update')
  if (!row) throw notFound('member')
  return row
}


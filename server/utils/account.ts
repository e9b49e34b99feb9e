import type { H3Event } from 'h3'
import { and, asc, eq, sql } from 'drizzle-orm'
import { memberships, practices, users, type User } from '../db/schema'

/** Finds an account by e-mail, ignoring case (the unique index is on lower(email)). */
export async function findUserByEmail(email: string): Promise<User | undefined> {
  const [user] = await useDb().select().from(users).where(sql`lower(${users.email}) = lower(${email})`)
  return user
}

/** The practice to open after sign-in: `preferred` if still a member there, else the oldest membership. */
export async function pickPractice(userId: string, preferred?: string | null): Promise<string | null> {
  const rows = await useDb().select({ practiceId: memberships.practiceId }).from(memberships)
    .where(eq(memberships.userId, userId)).orderBy(asc(memberships.createdAt))
  if (preferred && rows.some(r => r.practiceId === preferred)) return preferred
  return rows[0]?.practiceId ?? null
}

/** Starts a fresh session (a new cookie, so a session id planted before sign-in is worthless). */
export async function startSession(event: H3Event, user: Pick<User, 'id' | 'name' | 'email' | 'sessionVersion'>, practiceId: string | null) {
  await replaceUserSession(event, {
    user: { id: user.id, name: user.name, email: user.email },
    practiceId,
    loggedInAt: new Date().toISOString(),
    secure: { version: user.sessionVersion },
  })
}

/** The caller's memberships, for /api/me and the practice switcher. */
export async function practicesOf(userId: string) {
  return useDb().select({ id: practices.id, name: practices.name, role: memberships.role })
    .from(memberships).innerJoin(practices, eq(practices.id, memberships.practiceId))
    .where(eq(memberships.userId, userId)).orderBy(asc(practices.name))
}

/** True when `userId` is a member of `practiceId`. */
export async function isMember(userId: string, practiceId: string) {
  const [row] = await useDb().select({ id: memberships.id }).from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.practiceId, practiceId)))
  return Boolean(row)
}

/** A URL-safe slug for a new practice; a random tail keeps it unique without a lookup. */
export function practiceSlug(name: string, tail: string) {
  const base = name.normalize('NFKD').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40)
  return `${base || 'practice'}-${tail.toLowerCase()}`
}

// A real scrypt hash of a random password: checking against it costs as much as a real check,
// so an unknown e-mail answers as slowly as a wrong password.
let decoyHash: Promise<string> | undefined
export const decoyPasswordHash = () => (decoyHash ??= hashPassword(`decoy-${Math.random()}-${Date.now()}`))

import type { H3Event } from 'h3'
import { eq, sql } from 'drizzle-orm'
import { rateLimits } from '../db/schema'

/** A fixed window: at most `limit` counted events per `windowSeconds` for `key`. */
export interface LimitRule {
  key: string
  limit: number
  windowSeconds: number
}

/** Sign-in failures: per account and per address (the address allows more: several people share one). */
export const signInRules = (email: string, ip: string): LimitRule[] => [
  { key: `sign-in:account:${email.toLowerCase()}`, limit: 5, windowSeconds: 15 * 60 },
  { key: `sign-in:ip:${ip}`, limit: 20, windowSeconds: 15 * 60 },
]

/** Reset e-mails: per address asked for and per caller. */
export const forgotRules = (email: string, ip: string): LimitRule[] => [
  { key: `forgot:account:${email.toLowerCase()}`, limit: 3, windowSeconds: 15 * 60 },
  { key: `forgot:ip:${ip}`, limit: 10, windowSeconds: 15 * 60 },
]

/** New practices from one address. */
export const signUpRules = (ip: string): LimitRule[] => [
  { key: `sign-up:ip:${ip}`, limit: 10, windowSeconds: 60 * 60 },
]

function tooMany(event: H3Event, retryAfter: number) {
  const minutes = Math.max(1, Math.ceil(retryAfter / 60))
  setResponseHeader(event, 'Retry-After', retryAfter)
  return createError({
    status: 429,
    message: `Too many attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`,
    data: { retryAfterSeconds: retryAfter },
  })
}

/** Throws 429 (with Retry-After) when any rule's current window is already full. Counts nothing. */
export async function assertUnderLimits(event: H3Event, rules: LimitRule[]) {
  for (const rule of rules) {
    const [row] = await useDb()
      .select({
        count: rateLimits.count,
        secondsLeft: sql<number>`ceil(extract(epoch from (${rateLimits.windowStartedAt} + make_interval(secs => ${rule.windowSeconds}::double precision) - now())))::int`,
      })
      .from(rateLimits)
      .where(eq(rateLimits.key, rule.key))
    if (row && row.secondsLeft > 0 && row.count >= rule.limit) throw tooMany(event, row.secondsLeft)
  }
}

/** Counts one event against every rule (atomic upsert, so it holds across app instances). */
export async function countAgainst(rules: LimitRule[]) {
  for (const rule of rules) {
    const window = sql`make_interval(secs => ${rule.windowSeconds}::double precision)`
    await useDb().insert(rateLimits).values({ key: rule.key, count: 1 }).onConflictDoUpdate({
      target: rateLimits.key,
      set: {
        count: sql`CASE WHEN ${rateLimits.windowStartedAt} + ${window} <= now() THEN 1 ELSE ${rateLimits.count} + 1 END`,
        windowStartedAt: sql`CASE WHEN ${rateLimits.windowStartedAt} + ${window} <= now() THEN now() ELSE ${rateLimits.windowStartedAt} END`,
      },
    })
  }
  // Old windows are dead weight; sweep them now and then.
  if (Math.random() < 0.05) await useDb().delete(rateLimits).where(sql`${rateLimits.windowStartedAt} < now() - interval '1 day'`)
}

/** Forgets the counter for `key` (after a successful sign-in to that account). */
export async function clearLimit(key: string) {
  await useDb().delete(rateLimits).where(eq(rateLimits.key, key))
}

import type { H3Event } from 'h3'
import { auditEvents } from '../db/schema'
import type { Database } from '../db/client'

/** Who acted and in which practice; a MemberContext fits, so does a partial one (failed sign-in). */
export interface AuditActor {
  user?: { id: string } | null
  practice?: { id: string } | null
}

/** The caller's address; X-Forwarded-For is believed only behind a proxy you declared (LAMINA_TRUST_PROXY=1). */
export function clientIp(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: process.env.LAMINA_TRUST_PROXY === '1' }) ?? 'unknown'
}

/**
 * Appends one audit event: who (actor), what (action, subject, detail), when (now), from where (ip, agent).
 * Pass a transaction as `db` so the event is written with the change it records, or not at all.
 */
export async function audit(
  event: H3Event,
  actor: AuditActor | null,
  action: string,
  subject: { type: string, id: string } | null = null,
  detail: Record<string, unknown> = {},
  db: Pick<Database, 'insert'> = useDb(),
) {
  await db.insert(auditEvents).values({
    practiceId: actor?.practice?.id ?? null,
    actorId: actor?.user?.id ?? null,
    action,
    subjectType: subject?.type ?? null,
    subjectId: subject?.id ?? null,
    detail,
    ip: clientIp(event),
    userAgent: (getRequestHeader(event, 'user-agent') ?? '').slice(0, 300) || null,
  })
}

import { desc, eq, lt, and } from 'drizzle-orm'
import { z } from 'zod'
import { auditEvents, users } from '../../db/schema'

const Query = z.strictObject({
  limit: z.coerce.number({ error: 'limit must be a number.' }).int().min(1).max(200).default(50),
  before: z.iso.datetime({ error: 'before must be an ISO date-time like 2026-01-31T09:00:00Z.' }).optional(),
})

// The practice's audit log, newest first: who, what, when, from where.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'audit.view')
  const query = queryWith(event, Query)
  const events = await useDb().select({
    id: auditEvents.id, action: auditEvents.action, subjectType: auditEvents.subjectType, subjectId: auditEvents.subjectId,
    detail: auditEvents.detail, ip: auditEvents.ip, at: auditEvents.createdAt, actor: { id: users.id, name: users.name },
  }).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(inPractice(auditEvents.practiceId, ctx), query.before ? lt(auditEvents.createdAt, new Date(query.before)) : undefined))
    .orderBy(desc(auditEvents.createdAt)).limit(query.limit)
  return { events }
})

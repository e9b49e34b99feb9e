import { and, asc, desc, eq, gt, isNull } from 'drizzle-orm'
import { invitations, memberships, users } from '../../db/schema'

// The practice's members and its open invitations.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'members.view')
  const db = useDb()
  const [members, pending] = await Promise.all([
    db.select({ id: memberships.id, userId: users.id, name: users.name, email: users.email, role: memberships.role, since: memberships.createdAt })
      .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
      .where(inPractice(memberships.practiceId, ctx)).orderBy(asc(users.name)),
    db.select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, sentAt: invitations.createdAt })
      .from(invitations)
      .where(and(inPractice(invitations.practiceId, ctx), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, new Date())))
      .orderBy(desc(invitations.createdAt)),
  ])
  return { members: members.map(m => ({ ...m, isYou: m.userId === ctx.user.id })), invitations: pending }
})

import { eq } from 'drizzle-orm'
import { invitations, practices, users } from '../db/schema'

/**
 * The invitation behind a link token, if it can still be used: 404 for an unknown token,
 * 410 for one already used, withdrawn or expired (each with its own plain message).
 */
export async function openInvitation(token: string) {
  const [row] = await useDb().select({
    id: invitations.id,
    practiceId: invitations.practiceId,
    practiceName: practices.name,
    email: invitations.email,
    role: invitations.role,
    expiresAt: invitations.expiresAt,
    acceptedAt: invitations.acceptedAt,
    revokedAt: invitations.revokedAt,
    invitedByName: users.name,
  }).from(invitations)
    .innerJoin(practices, eq(practices.id, invitations.practiceId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, hashToken(token)))
  if (!row) throw createError({ status: 404, message: 'This invitation link is not valid. Ask the practice to send a new one.' })
  if (row.acceptedAt) throw createError({ status: 410, message: 'This invitation has already been used. Sign in instead.' })
  if (row.revokedAt) throw createError({ status: 410, message: 'This invitation was withdrawn. Ask the practice to send a new one.' })
  if (row.expiresAt.getTime() <= Date.now()) throw createError({ status: 410, message: 'This invitation has expired (invitations work for seven days). Ask the practice to send a new one.' })
  return row
}

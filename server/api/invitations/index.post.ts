import { and, eq, isNull, sql } from 'drizzle-orm'
import { ROLE_LABELS } from '#shared/permissions'
import { InviteBody } from '#shared/schemas/account'
import { invitations, memberships, users } from '../../db/schema'

// Invites a person by e-mail with a role. Owners invite any role; coaches invite clients.
// The link works once, for seven days, and carries the role it was sent with.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'clients.invite')
  const body = await readBodyWith(event, InviteBody)
  if (body.role !== 'client') assertCan(ctx, 'members.invite')

  const [alreadyMember] = await useDb().select({ id: memberships.id }).from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(inPractice(memberships.practiceId, ctx), sql`lower(${users.email}) = lower(${body.email})`))
  if (alreadyMember) {
    throw badRequest([{ path: 'body.email', message: 'This person is already a member of this practice.' }], 'No invitation was sent.')
  }

  const token = newToken()
  const invitation = await useDb().transaction(async (tx) => {
    // A new invitation replaces any still-open one for the same address.
    await tx.update(invitations).set({ revokedAt: new Date() }).where(and(
      inPractice(invitations.practiceId, ctx),
      sql`lower(${invitations.email}) = lower(${body.email})`,
      isNull(invitations.acceptedAt), isNull(invitations.revokedAt),
    ))
    const [invitation] = await tx.insert(invitations).values({
      practiceId: ctx.practice.id,
      email: body.email,
      role: body.role,
      tokenHash: hashToken(token),
      invitedBy: ctx.user.id,
      expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS),
    }).returning()
    await audit(event, ctx, 'invitation.sent', { type: 'invitation', id: invitation!.id }, { email: body.email, role: body.role }, tx)
    // Sent inside the transaction: if the mail fails, no invitation is left behind.
    const role = ROLE_LABELS[body.role].toLowerCase()
    await sendMail(composeMail(body.email, `${ctx.user.name} invited you to ${ctx.practice.name} on Lamina`, [
      `Hello${body.name ? ` ${body.name}` : ''},`,
      `${ctx.user.name} invited you to join ${ctx.practice.name} on Lamina as ${/^[aeiou]/.test(role) ? 'an' : 'a'} ${role}.`,
      'Lamina is where the practice designs, reviews and hands out short exercise protocols. It supports, and does not replace, medical advice and licensed practice.',
      'The link below works once and expires in seven days.',
    ], { label: 'Accept the invitation', url: appLink(`/invite/${token}`) },
    'If you were not expecting this, ignore this message and nothing will happen.'))
    return invitation!
  })
  setResponseStatus(event, 201)
  return { invitation: { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt } }
})

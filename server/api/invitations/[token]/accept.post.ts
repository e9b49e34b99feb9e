import { and, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'
import { AcceptBody, NewPasswordSchema, TokenSchema } from '#shared/schemas/account'
import { invitations, memberships, users } from '../../../db/schema'

const Params = z.object({ token: TokenSchema })

// Accepts an invitation: a new person chooses a name and password; someone with an account
// confirms their password (or is already signed in as the invited address). The membership
// gets the role the invitation was sent with, never one from the request.
export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, Params)
  const body = await readBodyWith(event, AcceptBody)
  const invitation = await openInvitation(token)
  const existing = await findUserByEmail(invitation.email)
  const session = await getUserSession(event)

  if (existing && session.user?.id !== existing.id) {
    const rules = signInRules(existing.email, clientIp(event))
    await assertUnderLimits(event, rules)
    if (!body.password || !existing.passwordHash || !(await verifyPassword(existing.passwordHash, body.password))) {
      await countAgainst(rules)
      throw badRequest([{ path: 'body.password', message: `Enter the password of your Lamina account (${invitation.email}).` }], 'The invitation was not accepted.')
    }
  }
  if (!existing) {
    const issues = [
      ...(body.name ? [] : [{ path: 'body.name', message: 'Enter your name.' }]),
      ...NewPasswordSchema.safeParse(body.password).error?.issues.map(i => ({ path: 'body.password', message: i.message })) ?? [],
    ]
    if (issues.length) throw badRequest(issues, 'The invitation was not accepted.')
  }

  const passwordHash = existing ? null : await hashPassword(body.password!)
  const user = await useDb().transaction(async (tx) => {
    const claimed = await tx.update(invitations).set({ acceptedAt: new Date() })
      .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .returning({ id: invitations.id })
    if (!claimed.length) throw createError({ status: 410, message: 'This invitation has already been used.' })
    const user = existing ?? (await tx.insert(users).values({ name: body.name!, email: invitation.email, passwordHash }).returning())[0]!
    const [membership] = await tx.insert(memberships).values({ practiceId: invitation.practiceId, userId: user.id, role: invitation.role })
      .onConflictDoNothing().returning()
    if (!membership) throw createError({ status: 409, message: 'You are already a member of this practice.' })
    await audit(event, { user, practice: { id: invitation.practiceId } }, 'invitation.accepted',
      { type: 'invitation', id: invitation.id }, { role: invitation.role, membershipId: membership.id, newAccount: !existing }, tx)
    return user
  })
  await startSession(event, user, invitation.practiceId)
  return { user: { id: user.id, name: user.name, email: user.email }, practice: { id: invitation.practiceId, name: invitation.practiceName }, role: invitation.role }
})

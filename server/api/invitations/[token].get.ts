import { z } from 'zod'
import { TokenSchema } from '#shared/schemas/account'

const Params = z.object({ token: TokenSchema })

// What an invitation link offers (practice, role, address), so the page can ask the right questions.
export default defineEventHandler(async (event) => {
  const { token } = paramsWith(event, Params)
  const invitation = await openInvitation(token)
  const account = await findUserByEmail(invitation.email)
  const session = await getUserSession(event)
  return {
    practice: { name: invitation.practiceName },
    role: invitation.role,
    email: invitation.email,
    invitedBy: invitation.invitedByName,
    expiresAt: invitation.expiresAt,
    hasAccount: Boolean(account),
    signedInAsInvitee: Boolean(account && session.user?.id === account.id),
  }
})

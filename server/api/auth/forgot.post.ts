import { ForgotBody } from '#shared/schemas/account'
import { passwordResets } from '../../db/schema'

// Sends a single-use reset link valid for one hour. The answer is the same whether or not
// the address has an account, so it cannot be used to find out who uses Lamina.
export default defineEventHandler(async (event) => {
  const body = await readBodyWith(event, ForgotBody)
  const rules = forgotRules(body.email, clientIp(event))
  await assertUnderLimits(event, rules)
  await countAgainst(rules)

  const user = await findUserByEmail(body.email)
  if (user) {
    const token = newToken()
    await useDb().transaction(async (tx) => {
      const [reset] = await tx.insert(passwordResets).values({
        userId: user.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + RESET_LIFETIME_MS),
      }).returning()
      await audit(event, { user }, 'password_reset.requested', { type: 'password_reset', id: reset!.id }, {}, tx)
      await sendMail(composeMail(user.email, 'Choose a new Lamina password', [
        `Hello ${user.name},`,
        'Someone (we hope you) asked to choose a new password for your Lamina account. The link below works once, for one hour.',
      ], { label: 'Choose a new password', url: appLink(`/reset/${token}`) },
      'If you did not ask for this, ignore this message: your password stays as it is.'))
    })
  }
  return { sent: true, message: 'If an account uses that address, a link to choose a new password is on its way. It works for one hour.' }
})

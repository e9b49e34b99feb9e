import { and, eq, isNull, sql } from 'drizzle-orm'
import { ResetBody } from '#shared/schemas/account'
import { passwordResets, users } from '../../db/schema'

// Sets a new password from an e-mailed link: single use, one hour. Every other session of
// the account ends (session version bump), and this device is signed in.
export default defineEventHandler(async (event) => {
  const body = await readBodyWith(event, ResetBody)
  const [reset] = await useDb().select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(body.token)))
  if (!reset) throw createError({ status: 404, message: 'This link is not valid. Ask for a new one on the "Forgot password" page.' })
  if (reset.usedAt) throw createError({ status: 410, message: 'This link has already been used. Ask for a new one if you need to.' })
  if (reset.expiresAt.getTime() <= Date.now()) throw createError({ status: 410, message: 'This link has expired (links work for one hour). Ask for a new one.' })

  const passwordHash = await hashPassword(body.password)
  const user = await useDb().transaction(async (tx) => {
    // Marking it used only if still unused makes two clicks at once safe.
    const claimed = await tx.update(passwordResets).set({ usedAt: new Date() })
      .where(and(eq(passwordResets.id, reset.id), isNull(passwordResets.usedAt))).returning({ id: passwordResets.id })
    if (!claimed.length) throw createError({ status: 410, message: 'This link has already been used. Ask for a new one if you need to.' })
    const [user] = await tx.update(users).set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, reset.userId)).returning()
    await audit(event, { user }, 'password_reset.completed', { type: 'user', id: user!.id }, {}, tx)
    return user!
  })
  const practiceId = await pickPractice(user.id)
  await startSession(event, user, practiceId)
  return { user: { id: user.id, name: user.name, email: user.email }, practiceId }
})

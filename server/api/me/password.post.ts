import { eq, sql } from 'drizzle-orm'
import { PasswordChangeBody } from '#shared/schemas/account'
import { users } from '../../db/schema'

// Changes the password after checking the current one; other devices are signed out.
export default defineEventHandler(async (event) => {
  const { user } = await requireUser(event)
  const body = await readBodyWith(event, PasswordChangeBody)
  const rules = signInRules(user.email, clientIp(event))
  await assertUnderLimits(event, rules)
  const [row] = await useDb().select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id))
  if (!row?.passwordHash || !(await verifyPassword(row.passwordHash, body.currentPassword))) {
    await countAgainst(rules)
    throw badRequest([{ path: 'body.currentPassword', message: 'This is not your current password.' }], 'The password was not changed.')
  }
  const passwordHash = await hashPassword(body.newPassword)
  const updated = await useDb().transaction(async (tx) => {
    const [updated] = await tx.update(users).set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, user.id)).returning()
    await audit(event, { user }, 'password.changed', { type: 'user', id: user.id }, {}, tx)
    return updated!
  })
  const session = await getUserSession(event)
  await startSession(event, updated, session.practiceId ?? null)
  return { changed: true }
})

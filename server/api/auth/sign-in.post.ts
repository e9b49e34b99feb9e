import { SignInBody } from '#shared/schemas/account'

// Signs in with e-mail and password. Failures count against the account and the address
// (rate-limits.ts); the answer never says whether the e-mail has an account.
export default defineEventHandler(async (event) => {
  const body = await readBodyWith(event, SignInBody)
  const ip = clientIp(event)
  const rules = signInRules(body.email, ip)
  await assertUnderLimits(event, rules)

  const user = await findUserByEmail(body.email)
  const valid = await verifyPassword(user?.passwordHash ?? await decoyPasswordHash(), body.password)
  if (!user || !user.passwordHash || !valid) {
    await countAgainst(rules)
    await audit(event, { user: user ?? null }, 'sign_in.failed', user ? { type: 'user', id: user.id } : null, {
      email: body.email.toLowerCase().slice(0, 254),
      reason: user ? 'wrong password' : 'no such account',
    })
    throw createError({ status: 401, message: 'That e-mail and password do not match an account.' })
  }

  await clearLimit(rules[0]!.key)
  const previous = (await getUserSession(event)).practiceId
  const practiceId = await pickPractice(user.id, previous)
  await startSession(event, user, practiceId)
  await audit(event, { user, practice: practiceId ? { id: practiceId } : null }, 'sign_in.succeeded', { type: 'user', id: user.id })
  return { user: { id: user.id, name: user.name, email: user.email }, practiceId }
})

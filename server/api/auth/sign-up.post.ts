import { nanoid } from 'nanoid'
import { SignUpBody } from '#shared/schemas/account'
import { memberships, practices, users } from '../../db/schema'

// Creates an account and a new practice whose first member (its owner) is that account.
export default defineEventHandler(async (event) => {
  const body = await readBodyWith(event, SignUpBody)
  const rules = signUpRules(clientIp(event))
  await assertUnderLimits(event, rules)
  if (await findUserByEmail(body.email)) {
    throw badRequest([{ path: 'body.email', message: 'An account with this e-mail already exists. Sign in instead.' }], 'This e-mail is taken.')
  }

  const passwordHash = await hashPassword(body.password)
  const { user, practice } = await useDb().transaction(async (tx) => {
    const [user] = await tx.insert(users).values({ name: body.name, email: body.email, passwordHash }).returning()
    const [practice] = await tx.insert(practices).values({ name: body.practiceName, slug: practiceSlug(body.practiceName, nanoid(6)) }).returning()
    const [membership] = await tx.insert(memberships).values({ practiceId: practice!.id, userId: user!.id, role: 'owner' }).returning()
    await audit(event, { user, practice }, 'practice.created', { type: 'membership', id: membership!.id }, { practiceName: practice!.name }, tx)
    return { user: user!, practice: practice! }
  }).catch((error: { code?: string }) => {
    // Two sign-ups with one address at the same instant: the unique index decides.
    if (error.code === '23505') throw badRequest([{ path: 'body.email', message: 'An account with this e-mail already exists. Sign in instead.' }])
    throw error
  })
  await countAgainst(rules)
  await startSession(event, user, practice.id)
  setResponseStatus(event, 201)
  return { user: { id: user.id, name: user.name, email: user.email }, practice: { id: practice.id, name: practice.name }, role: 'owner' as const }
})

import { eq } from 'drizzle-orm'
import { ProfileBody } from '#shared/schemas/account'
import { users } from '../../db/schema'

// Changes the signed-in person's display name.
export default defineEventHandler(async (event) => {
  const { user } = await requireUser(event)
  const body = await readBodyWith(event, ProfileBody)
  const [updated] = await useDb().update(users).set({ name: body.name }).where(eq(users.id, user.id))
    .returning({ id: users.id, name: users.name, email: users.email })
  await setUserSession(event, { user: { ...user, name: updated!.name } })
  return { user: updated! }
})

import { SwitchPracticeBody } from '#shared/schemas/account'

// Switches the current practice to another one the person belongs to.
export default defineEventHandler(async (event) => {
  const { user } = await requireUser(event)
  const body = await readBodyWith(event, SwitchPracticeBody)
  // Not a member there and no such practice answer alike.
  if (!(await isMember(user.id, body.practiceId))) throw notFound('practice')
  await setUserSession(event, { practiceId: body.practiceId })
  return { practiceId: body.practiceId }
})

import { assessReadings } from '#shared/engine/requests'

// Category, mean arterial pressure and pulse pressure of each reading, their average, and the home average.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'engine.use')
  const outcome = assessReadings(await readJsonBody(event))
  if (!outcome.ok) throw badRequest(outcome.issues)
  return outcome.value
})

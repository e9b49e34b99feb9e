import { assessReadings } from '#shared/engine/requests'

// Category, mean arterial pressure and pulse pressure of each reading, their average, and the home average.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'engine.use')
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw badRequest([{ path: 'body', message: 'The body is not valid JSON.' }])
  }
  const outcome = assessReadings(body)
  if (!outcome.ok) throw badRequest(outcome.issues)
  return outcome.value
})

import { wallSquatRequest } from '#shared/engine/requests'

// Wall-squat knee angle from an incremental test: { stages, peakHeartRate, targetShare } → { kneeAngle, targetHeartRate, r }.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'engine.use')
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw badRequest([{ path: 'body', message: 'The body is not valid JSON.' }])
  }
  const outcome = wallSquatRequest(body)
  if (!outcome.ok) throw badRequest(outcome.issues)
  return outcome.value
})

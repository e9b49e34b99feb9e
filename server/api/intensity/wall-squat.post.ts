import { wallSquatRequest } from '#shared/engine/requests'

// Wall-squat knee angle from an incremental test: { stages, peakHeartRate, targetShare } → { kneeAngle, targetHeartRate, r }.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'engine.use')
  const outcome = wallSquatRequest(await readJsonBody(event))
  if (!outcome.ok) throw badRequest(outcome.issues)
  return outcome.value
})

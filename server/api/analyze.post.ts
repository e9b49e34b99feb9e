import { analyzeJsonRequest, analyzeYamlRequest } from '#shared/engine/requests'

// Timeline, metrics and findings of a protocol. JSON body { protocol, profile?, sessionsPerWeek? }
// (protocol as an object or YAML text), or a YAML body holding the protocol alone.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'engine.use')
  const library = await useEngineLibrary()
  const type = getRequestHeader(event, 'content-type') ?? ''
  let outcome
  if (/^(application|text)\/(x-)?yaml\b/i.test(type)) {
    const text = (await readRawBody(event, 'utf8')) ?? ''
    outcome = analyzeYamlRequest(text, getQuery(event), library)
  }
  else {
    outcome = analyzeJsonRequest(await readJsonBody(event), library)
  }
  if (!outcome.ok) throw badRequest(outcome.issues)
  return outcome.value
})

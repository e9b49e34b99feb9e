// The starter protocols a new template can begin from (blocks/starters/*.yaml).
export default defineEventHandler(async (event) => {
  await requireMember(event, 'templates.view')
  const starters = await loadStarters()
  return { starters: await Promise.all(starters.map(async s => ({ ...s, summary: await summarize(s.document) }))) }
})

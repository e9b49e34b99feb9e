// The validated block library and rules, for the studio to analyze in the browser.
export default defineEventHandler(async (event) => {
  await requireMember(event, 'library.view')
  const { blocks, rules } = await useEngineLibrary()
  return { blocks, rules }
})

// The validated block library and rules, for the studio to analyze in the browser.
export default defineEventHandler(async () => {
  const { blocks, rules } = await useEngineLibrary()
  return { blocks, rules }
})

// Liveness of the app and its database. 200 when both answer, 503 (with the reason) when the database does not.
export default defineEventHandler(async (event) => {
  const started = performance.now()
  let database: { status: 'up' | 'down', latencyMs?: number, error?: string }
  try {
    await Promise.race([
      useSql()`SELECT 1`,
      new Promise((_, reject) => setTimeout(() => reject(new Error('no answer within 3 s')), 3000)),
    ])
    database = { status: 'up', latencyMs: Math.round((performance.now() - started) * 10) / 10 }
  }
  catch (error) {
    database = { status: 'down', error: `The database is not reachable: ${(error as Error).message}` }
  }
  setHeader(event, 'cache-control', 'no-store')
  if (database.status === 'down') setResponseStatus(event, 503)
  return {
    status: database.status === 'up' ? 'ok' : 'degraded',
    app: { status: 'up', name: 'Lamina' },
    database,
    checkedAt: new Date().toISOString(),
  }
})

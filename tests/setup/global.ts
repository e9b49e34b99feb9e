// Starts what the integration tests need, all private to the test run: a throwaway
// PostgreSQL cluster (never the user's .data/pg), the mail catcher, and the built app.
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
// @ts-expect-error plain ESM helpers shared with the start script
import { ROOT } from '../../scripts/lib/setup.mjs'
import { startStack, type Stack } from './stack'

declare module 'vitest' {
  // What tests read with inject(): everything about the stack but its stop function.
  export interface ProvidedContext extends Omit<Stack, 'stop'> {}
}

export default async function setup(project: TestProject) {
  // A folder per run, so two checkouts' (or two people's) runs never share a cluster.
  const stack = await startStack({
    dir: join(ROOT, '.data', 'test-runs', String(process.pid)),
    database: 'lamina_test',
    pgPort: Number(process.env.LAMINA_TEST_PG_PORT || 54329),
    log: line => console.log(`[test setup] ${line}`),
  })
  project.provide('baseUrl', stack.baseUrl)
  project.provide('databaseUrl', stack.databaseUrl)
  project.provide('adminDatabaseUrl', stack.adminDatabaseUrl)
  project.provide('mailDir', stack.mailDir)
  project.provide('pgDir', stack.pgDir)
  project.provide('pgPort', stack.pgPort)
  return stack.stop
}

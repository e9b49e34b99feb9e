import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const alias = {
  '#shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '~~': fileURLToPath(new URL('.', import.meta.url)),
}

// Two projects: `unit` is pure and fast; `integration` runs against the real
// PostgreSQL cluster, the built app and Chromium that tests/setup/global.ts starts.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          include: ['tests/api/**/*.test.ts', 'tests/browser/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
})

import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'
import { fileURLToPath } from 'node:url'

// Four kinds of test, each its own project (DEVELOPERS.md says what goes where).
// `bench` runs only through `npm run bench`.
const bench = process.env.FLOATWISE_BENCH === '1'
// Nuxt's `#shared` alias for the projects that run outside Nuxt.
const resolve = { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) } }

export default defineConfig({
  test: {
    projects: bench
      ? [
          {
            resolve,
            test: {
              name: 'bench',
              include: ['tests/bench/**/*.bench.ts'],
              environment: 'node',
              testTimeout: 600_000,
              hookTimeout: 60_000,
              globalSetup: ['tests/support/globalServer.ts'],
              fileParallelism: false,
            },
          },
        ]
      : [
          { resolve, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
          await defineVitestProject({
            test: { name: 'nuxt', include: ['tests/nuxt/**/*.test.ts'], environment: 'nuxt', hookTimeout: 60_000 },
          }),
          {
            resolve,
            test: {
              name: 'integration',
              include: ['tests/integration/**/*.test.ts'],
              environment: 'node',
              globalSetup: ['tests/support/globalServer.ts'],
              testTimeout: 30_000,
              hookTimeout: 60_000,
            },
          },
          {
            resolve,
            test: {
              name: 'browser',
              include: ['tests/browser/**/*.test.ts'],
              environment: 'node',
              globalSetup: ['tests/support/globalServer.ts'],
              testTimeout: 60_000,
              hookTimeout: 60_000,
              fileParallelism: false,
            },
          },
        ],
  },
})

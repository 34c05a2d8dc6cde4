import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url))

// Three tiers: pure unit tests, API tests against the built server, browser tests in Chromium.
export default defineConfig({
  test: {
    projects: [
      {
        // app/ and server/ code under unit test names its neighbours by the Nuxt aliases.
        resolve: { alias: { '~': here('./app'), '#shared': here('./shared'), '#server': here('./server') } },
        test: {
          name: 'unit',
          environment: 'node',
          include: ['tests/unit/**/*.test.ts'],
          // The property tests over a real SQLite file take 3-4 s on a quiet 2-core machine and
          // went past vitest's 5 s default once while builds shared it: a limit, not a measure.
          testTimeout: 20_000,
        },
      },
      {
        test: {
          name: 'api',
          environment: 'node',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/support/global-server.ts'],
          testTimeout: 30_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        test: {
          name: 'browser',
          environment: 'node',
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/support/global-server.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // A page under a loaded machine can take seconds to hydrate; expect.poll's own
          // default (1 s) made browser steps fail on a busy CI box, not on a wrong page.
          expect: { poll: { timeout: 15_000, interval: 100 } },
        },
      },
    ],
  },
})

import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

// Three projects, each with its own environment (roe.dev vitest.config.mts shape):
// unit = pure shared/ code in node; nuxt = components, composables and stores in a Nuxt
// environment; api = HTTP tests against the built server and the real MariaDB that
// scripts/test.sh starts (BASE_URL).
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      await defineVitestProject({
        test: {
          name: 'nuxt',
          include: ['tests/nuxt/**/*.test.ts'],
          environment: 'nuxt',
          setupFiles: ['tests/setup.ts'],
          // Starting the Nuxt environment takes seconds on a busy 2-core machine; a slow start is
          // not a failure.
          hookTimeout: 60_000,
          testTimeout: 30_000,
        },
      }),
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
})

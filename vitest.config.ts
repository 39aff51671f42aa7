import { defineConfig } from 'vitest/config'

// Two projects. unit: pure logic, no services. system: HTTP against the built server with a real
// MariaDB (tests/integration) and a real browser (tests/browser); its global setup starts the
// test database, the e-mail fake and the built server once per run, on ports of their own.
export default defineConfig({
  test: {
    reporters: ['default', ['json', { outputFile: 'test-results/vitest.json' }]],
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'system',
          include: ['tests/integration/**/*.test.ts', 'tests/browser/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/system.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
})

import { defineConfig } from 'vitest/config'

// Four suites: pure code in node, the built server over HTTP with the real MariaDB, the fault suite, and real Chromium.
// `npm test` (scripts/test.ts) prepares the database and the build before vitest starts.
export default defineConfig({
  test: {
    // One file at a time across all suites: server and browser files each start a built server on a
    // free port, and two of them picking ports at once can collide.
    fileParallelism: false,
    maxWorkers: 1,
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
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          // The files share one test database and start servers of their own: one at a time.
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
      {
        test: {
          // Phones sending through lost answers, a killed server and a stopped database (its own MariaDB).
          name: 'faults',
          include: ['tests/faults/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 300_000,
          hookTimeout: 180_000,
        },
      },
      {
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
})

import { defineConfig } from 'vitest/config'
import react from '@vitejs/plugin-react'
import { alias } from './vite.config'

// Five projects: pure units, client components, API against a real PostgreSQL, the
// reliability suite (access matrix, hostile inputs, races, crash) against the same, and the
// browser against the built app. The API and browser projects each start their own
// PostgreSQL cluster and mail catcher on free loopback ports (tests/setup/services.ts).
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          environment: 'node',
          include: ['shared/**/*.test.ts', 'tests/unit/**/*.test.ts', 'server/**/*.test.ts'],
          setupFiles: ['tests/setup/fail-on-console-error.ts'],
        },
      },
      {
        plugins: [react()],
        resolve: { alias },
        test: {
          name: 'client',
          environment: 'happy-dom',
          include: ['src/**/*.test.tsx', 'src/**/*.test.ts'],
          setupFiles: ['tests/setup/client.ts', 'tests/setup/fail-on-console-error.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          environment: 'node',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/setup/services.ts'],
          setupFiles: ['tests/setup/api-db.ts', 'tests/setup/fail-on-console-error.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          pool: 'forks',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'reliability',
          environment: 'node',
          include: ['tests/reliability/**/*.test.ts'],
          globalSetup: ['tests/setup/services.ts'],
          setupFiles: ['tests/setup/api-db.ts', 'tests/setup/fail-on-console-error.ts'],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          pool: 'forks',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/services.ts', 'tests/setup/e2e-server.ts'],
          setupFiles: ['tests/setup/fail-on-console-error.ts'],
          fileParallelism: false,
          // A page waits on the server and the mail catcher: the 1 s default is too short on a busy CI machine.
          expect: { poll: { timeout: 10_000 } },
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})

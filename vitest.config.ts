import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

// The domain package is consumed from source in tests so a change needs no rebuild;
// production builds consume domain/dist.
const domainSrc = fileURLToPath(new URL('./domain/src/index.ts', import.meta.url));
const alias = { '@driftgrid/domain': domainSrc };
// Console output of passing tests (deliberate faults log errors on purpose) is dropped from the
// report; a failing test still shows everything it printed. The api logs through console under test.
const silent = 'passed-only' as const;

export default defineConfig({
  resolve: { alias },
  test: {
    // A root-only option: vitest ignores (and its types refuse) `silent` inside a project.
    silent,
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: [
            'domain/src/**/*.spec.ts',
            'worker/src/**/*.spec.ts',
            'api/src/**/*.spec.ts',
            'tests/unit/**/*.test.ts',
          ],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'ui',
          include: ['ui/src/**/*.spec.{ts,tsx}'],
          environment: 'happy-dom',
          setupFiles: ['ui/src/test/setup.ts'],
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120000,
          hookTimeout: 60000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'queue',
          include: ['tests/queue/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120000,
          hookTimeout: 60000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120000,
          hookTimeout: 120000,
          fileParallelism: false,
        },
      },
    ],
  },
});

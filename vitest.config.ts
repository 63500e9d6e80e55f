import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// The zod-free half of the cell-kind registry first: an alias also matches the longer names under it.
const alias = {
  '@laminote/contracts/cell-kinds': fileURLToPath(new URL('./libs/contracts/src/cell-kinds.ts', import.meta.url)),
  '@laminote/aero': fileURLToPath(new URL('./libs/aero/src/index.ts', import.meta.url)),
  '@laminote/contracts': fileURLToPath(new URL('./libs/contracts/src/index.ts', import.meta.url)),
};

/**
 * Node-side tests. The web app's tests run through Angular's unit-test builder (`ng test`).
 * `tests/api` and `tests/e2e` need the services that scripts/test.ts starts (PostgreSQL, the identity
 * provider fake, the SMTP sink); they read their addresses from the environment it sets.
 */
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'libs', include: ['libs/**/*.spec.ts'], environment: 'node' } },
      { resolve: { alias }, test: { name: 'server', include: ['server/**/*.spec.ts', 'oidc-fake/**/*.spec.ts', 'scripts/**/*.spec.ts'], environment: 'node' } },
      {
        resolve: { alias },
        test: { name: 'api', include: ['tests/api/**/*.spec.ts'], environment: 'node', fileParallelism: false, testTimeout: 30_000, hookTimeout: 60_000 },
      },
      {
        resolve: { alias },
        test: { name: 'e2e', include: ['tests/e2e/**/*.spec.ts'], environment: 'node', fileParallelism: false, testTimeout: 90_000, hookTimeout: 120_000 },
      },
    ],
  },
});

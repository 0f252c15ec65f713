import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const adminUrl = process.env.TIDEMARK_TEST_PG_URL;
if (!adminUrl) throw new Error('Set TIDEMARK_TEST_PG_URL to an admin postgres:// address, or run `npm run test:pg`, which starts a throwaway server.');

/**
 * The API tests on PostgreSQL (`npm run test:pg`): each test app gets its own database on the
 * server named by TIDEMARK_TEST_PG_URL. DATABASE_URL is set for the workers so entities and
 * migrations pick PostgreSQL's column types when they load.
 */
export default defineConfig({
  resolve: {
    alias: {
      '@tidemark/shared': fileURLToPath(new URL('../../shared/index.ts', import.meta.url)),
      '@tidemark/analytics': fileURLToPath(new URL('../../analytics/index.ts', import.meta.url)),
    },
  },
  test: {
    environment: 'node',
    globals: true,
    // The API tests, plus the PostgreSQL-only ones (copy-to-pg).
    include: ['test/api/**/*.spec.ts', 'test/pg/**/*.spec.ts'],
    env: { DATABASE_URL: adminUrl, TIDEMARK_TEST_PG_URL: adminUrl },
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
    // Two files at a time on a 2-core machine; each creates and drops its own databases.
    maxWorkers: 2,
  },
});

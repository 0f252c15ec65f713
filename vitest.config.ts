import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

/** Server, shared and analytics tests. The Angular app's specs run through `ng test`. */
export default defineConfig({
  resolve: {
    alias: {
      '@tidemark/shared': fileURLToPath(new URL('./shared/index.ts', import.meta.url)),
      '@tidemark/analytics': fileURLToPath(new URL('./analytics/index.ts', import.meta.url)),
    },
  },
  test: {
    environment: 'node',
    globals: true,
    include: ['analytics/**/*.spec.ts', 'shared/**/*.spec.ts', 'server/**/*.spec.ts', 'test/api/**/*.spec.ts', 'test/maintenance/**/*.spec.ts', 'test/docs/**/*.spec.ts', 'test/fuzz/**/*.fuzz.spec.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});

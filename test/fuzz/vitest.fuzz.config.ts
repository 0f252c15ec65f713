import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import root from '../../vitest.config';

/** The write-route fuzz suite alone (`npm run test:fuzz`; `FUZZ_RUNS=10000` for the long run). */
export default defineConfig({
  ...root,
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    ...root.test,
    include: ['test/fuzz/**/*.fuzz.spec.ts'],
  },
});

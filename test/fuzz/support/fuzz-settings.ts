import type { FuzzSettings } from './route-property';

/** The seed of every default run (CI): fixed, so a red run replays exactly. */
export const DEFAULT_FUZZ_SEED = 20261202;
/** Cases per route in the default run. */
export const DEFAULT_FUZZ_RUNS = 200;

/**
 * Runs and seed from the environment: `FUZZ_RUNS` (default 200) and `FUZZ_SEED` (default
 * {@link DEFAULT_FUZZ_SEED}; `random` draws a new one, which the suite prints).
 */
export function fuzzSettings(env: NodeJS.ProcessEnv = process.env): FuzzSettings {
  const runs = env['FUZZ_RUNS'] === undefined ? DEFAULT_FUZZ_RUNS : Number(env['FUZZ_RUNS']);
  if (!Number.isInteger(runs) || runs < 1) throw new Error(`FUZZ_RUNS must be a positive whole number, not "${env['FUZZ_RUNS']}".`);
  const seedText = env['FUZZ_SEED'];
  const seed = seedText === undefined ? DEFAULT_FUZZ_SEED : seedText === 'random' ? (Math.random() * 2 ** 31) | 0 : Number(seedText);
  if (!Number.isInteger(seed)) throw new Error(`FUZZ_SEED must be a whole number or "random", not "${seedText}".`);
  return { runs, seed };
}

/**
 * Builds the Angular client when dist/ is missing or older than its sources, so that
 * `npm start` works on a fresh clone and stays quick on later starts.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
const builtIndex = path.join(root, 'dist', 'tidemark', 'browser', 'index.html');
const sources = ['src', 'shared', 'public', 'angular.json', 'tsconfig.json', 'tsconfig.app.json', 'package-lock.json'];

function newestModification(entry: string): number {
  if (!existsSync(entry)) return 0;
  const stats = statSync(entry);
  if (!stats.isDirectory()) return stats.mtimeMs;
  let newest = stats.mtimeMs;
  for (const child of readdirSync(entry)) newest = Math.max(newest, newestModification(path.join(entry, child)));
  return newest;
}

const builtAt = existsSync(builtIndex) ? statSync(builtIndex).mtimeMs : 0;
const sourcesAt = Math.max(...sources.map((entry) => newestModification(path.join(root, entry))));
if (builtAt >= sourcesAt) {
  console.log('Client build is up to date.');
} else {
  console.log('Building the client (ng build)…');
  const result = spawnSync('npx', ['ng', 'build'], { cwd: root, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
  process.exit(result.status ?? 1);
}

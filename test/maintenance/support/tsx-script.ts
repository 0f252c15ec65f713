import { spawn } from 'node:child_process';
import { PROJECT_ROOT } from './killed-child';

/** How a script run ended. */
export interface ScriptRun {
  code: number | null;
  stdout: string;
  stderr: string;
  durationMs: number;
}

/** Runs `node --import tsx <script> ...args` from the project root, as `npm run <script>` does, with extra environment. */
export function runTsxScript(script: string, args: string[], env: Record<string, string>): Promise<ScriptRun> {
  const started = performance.now();
  const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], { cwd: PROJECT_ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  return new Promise((resolve, reject) => {
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr, durationMs: Math.round(performance.now() - started) }));
  });
}

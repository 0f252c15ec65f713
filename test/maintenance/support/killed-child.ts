import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** The project root: child scripts run from here so tsx finds tsconfig.json and its path aliases. */
export const PROJECT_ROOT = fileURLToPath(new URL('../../../', import.meta.url));

/** How a child ended and every mark it wrote (stdout lines). */
export interface ChildRun {
  marks: string[];
  signal: NodeJS.Signals | null;
  code: number | null;
  stderr: string;
  /** Milliseconds from spawn to the end. */
  durationMs: number;
}

/**
 * Runs `node --import tsx <script> ...args` and kills it with SIGKILL `delayMs` after the first
 * mark for which `killAfter` returns a delay. Resolves once the child is gone and its stdout is
 * drained, so the marks are all it wrote before dying.
 *
 * @param killAfter given each mark as it arrives; a number schedules the kill that many ms later
 * @param timeoutMs the child is killed anyway after this long (the test then sees no trigger mark)
 */
export function runUntilKilled(script: string, args: string[], killAfter: (mark: string) => number | null, timeoutMs = 30_000): Promise<ChildRun> {
  const started = performance.now();
  const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], { cwd: PROJECT_ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
  const marks: string[] = [];
  let pending = '';
  let stderr = '';
  let isKillScheduled = false;
  const kill = (): void => {
    child.kill('SIGKILL');
  };
  const deadline = setTimeout(kill, timeoutMs);
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  child.stdout.on('data', (chunk: Buffer) => {
    pending += chunk.toString();
    const lines = pending.split('\n');
    pending = lines.pop() ?? '';
    for (const line of lines) {
      marks.push(line);
      if (isKillScheduled) continue;
      const delayMs = killAfter(line);
      if (delayMs === null) continue;
      isKillScheduled = true;
      if (delayMs <= 0) kill();
      else setTimeout(kill, delayMs);
    }
  });
  return new Promise((resolve, reject) => {
    child.on('error', reject);
    child.on('close', (code, signal) => {
      clearTimeout(deadline);
      if (pending) marks.push(pending);
      resolve({ marks, signal, code, stderr, durationMs: Math.round(performance.now() - started) });
    });
  });
}

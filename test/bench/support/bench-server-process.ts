import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** The bench server (bench-server.ts) running as a child process on a temporary data dir. */
export interface BenchServerProcess {
  /** `http://127.0.0.1:<port>` */
  baseUrl: string;
  pid: number;
  /** Stops the child and deletes its data dir. */
  stop(): Promise<void>;
}

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..', '..', '..');
const entry = path.join(root, 'test', 'bench', 'support', 'bench-server.ts');
/** Seeding the demo practice (photographs included) on a busy two-core machine. */
const START_TIMEOUT_MS = 180_000;

/** Starts the bench server in its own process (so a load generator never shares its event loop) and waits until it listens. */
export async function startBenchServer(): Promise<BenchServerProcess> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'tidemark-bench-server-'));
  // SQLite on the temporary dir, whatever the calling shell points DATABASE_URL at.
  const { DATABASE_URL: _ignored, ...env } = process.env;
  const child = spawn(process.execPath, ['--import', 'tsx', entry], { cwd: root, env: { ...env, BENCH_DATA_DIR: dataDir }, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  let isListening = false;
  const port = await new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`The bench server did not start in time:\n${output}`)), START_TIMEOUT_MS);
    // Keeps reading after start-up too, so a full pipe never blocks the server.
    const onData = (chunk: Buffer): void => {
      if (isListening) return;
      output += chunk.toString();
      const match = /\{"port":(\d+)\}/.exec(output);
      if (match) {
        isListening = true;
        clearTimeout(timer);
        resolve(Number(match[1]));
      }
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`The bench server exited with ${code}:\n${output}`));
    });
  });
  const pid = child.pid;
  if (pid === undefined) throw new Error('The bench server has no process id.');
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    pid,
    stop: () =>
      new Promise<void>((resolve) => {
        child.removeAllListeners('exit');
        if (child.exitCode !== null || child.signalCode !== null) {
          rmSync(dataDir, { recursive: true, force: true });
          resolve();
          return;
        }
        child.once('exit', () => {
          rmSync(dataDir, { recursive: true, force: true });
          resolve();
        });
        child.kill('SIGTERM');
      }),
  };
}

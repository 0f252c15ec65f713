/**
 * `npm run bench`: runs every benchmark in its own child process, one after the other (never two
 * at once: they would measure each other), passes their progress through on stderr, collects the
 * bench lines they print and prints them all together at the end, one JSON line per figure.
 * Exits 0 even when a goal is missed (the line says `"met": false`); a bench that crashes or
 * prints nothing gets a line of its own with `"met": false` and the error.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { parseBenchLines, printBenchLine, type BenchLine } from './support/bench-line';

/** Each bench, by its figure name, in the order they run (cheapest first). */
const BENCHES: readonly { name: string; file: string }[] = [
  { name: 'analytics-summary', file: 'analytics-summary.ts' },
  { name: 'import-10k', file: 'import-10k.ts' },
  { name: 'export-100k', file: 'export-100k.ts' },
  { name: 'api-throughput', file: 'api-throughput.ts' },
  { name: 'client-bundle', file: 'client-bundle.ts' },
];

const here = path.dirname(new URL(import.meta.url).pathname);

/** Runs one bench file; resolves with its stdout and exit code. */
function runBench(file: string): Promise<{ stdout: string; code: number | null }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(here, file)], { stdio: ['ignore', 'pipe', 'inherit'] });
    let stdout = '';
    child.stdout.on('data', (chunk: Buffer) => {
      stdout += chunk.toString();
    });
    child.once('error', reject);
    child.once('close', (code) => resolve({ stdout, code }));
  });
}

/** The line standing in for a bench that produced none. */
function failureLine(name: string, error: string): BenchLine {
  return { name, value: null, floor: null, ratio: null, goal: null, unit: '', met: false, criteria: 'the bench must run to the end', error };
}

const collected: BenchLine[] = [];
for (const bench of BENCHES) {
  console.error(`\n== ${bench.name} ==`);
  const startedAt = Date.now();
  try {
    const { stdout, code } = await runBench(bench.file);
    const lines = parseBenchLines(stdout);
    if (code !== 0) lines.push(failureLine(bench.name, `exited with ${code}`));
    else if (lines.length === 0) lines.push(failureLine(bench.name, 'printed no bench line'));
    collected.push(...lines);
  } catch (error) {
    // A bench that cannot even start is reported like one that crashed; the others still run.
    collected.push(failureLine(bench.name, error instanceof Error ? error.message : String(error)));
  }
  console.error(`== ${bench.name}: ${Math.round((Date.now() - startedAt) / 1000)} s ==`);
}
console.error('');
for (const line of collected) printBenchLine(line);

/**
 * One figure of `npm run bench`, printed as one JSON line on stdout. The first seven fields are
 * the same for every figure; a figure adds its own (peak RSS, p99, endpoint …) after them.
 */
export interface BenchLine {
  /** Fixed name of the figure (`analytics-summary`, `api-throughput`, …); several lines may share one. */
  name: string;
  /** What was measured, in `unit`; null when the measurement failed. */
  value: number | null;
  /** The same measured for the floor, side by side in the same run; null when the figure has none. */
  floor: number | null;
  /** value / floor, two decimals; null without a floor. */
  ratio: number | null;
  /** The headline goal, in the terms `criteria` states (a ratio, or an absolute bound). */
  goal: number | null;
  unit: string;
  /** Whether every goal in `criteria` was met. */
  met: boolean;
  /** The goals in words, e.g. "ratio <= 2 and peak RSS < 300 MB". */
  criteria: string;
  [extra: string]: unknown;
}

/** value / floor rounded to two decimals (null when either is missing or the floor is zero). */
export function ratioOf(value: number | null, floor: number | null): number | null {
  if (value === null || floor === null || floor === 0) return null;
  return Math.round((value / floor) * 100) / 100;
}

/** Prints the line (common fields first) as one JSON line on stdout. */
export function printBenchLine(line: BenchLine): void {
  const { name, value, floor, ratio, goal, unit, met, criteria, ...extra } = line;
  console.log(JSON.stringify({ name, value, floor, ratio, goal, unit, met, criteria, ...extra }));
}

/** The bench lines among a child's stdout lines (anything else, e.g. progress, is ignored). */
export function parseBenchLines(stdout: string): BenchLine[] {
  const lines: BenchLine[] = [];
  for (const text of stdout.split('\n')) {
    if (!text.startsWith('{')) continue;
    let parsed: unknown;
    try {
      parsed = JSON.parse(text);
    } catch {
      // Not JSON after all: progress output that happens to start with a brace.
      continue;
    }
    if (isBenchLine(parsed)) lines.push(parsed);
  }
  return lines;
}

function isBenchLine(value: unknown): value is BenchLine {
  return (
    typeof value === 'object' &&
    value !== null &&
    'name' in value &&
    typeof value.name === 'string' &&
    'met' in value &&
    typeof value.met === 'boolean' &&
    'value' in value &&
    'floor' in value &&
    'ratio' in value
  );
}

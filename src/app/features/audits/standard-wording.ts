import {
  STANDARD_METRIC_INFO,
  type ObservedStandardValue,
  type RecallInterval,
  type StandardView,
} from '@tidemark/shared';

/** How a standard's numbers are read: a share, millimetres or papilla-index points. */
export type MeasureUnit = '%' | 'mm' | 'score';

/** A value in its unit: `82.4%`, `0.8 mm`, `+0.3 points`. Rebound and score changes keep a true minus sign. */
export function formatMeasure(value: number, unit: MeasureUnit): string {
  // Round first so −0.04 reads as 0.0, not −0.0.
  const rounded = Math.round(value * 10) / 10;
  const sign = rounded < 0 ? '−' : '';
  const magnitude = Math.abs(rounded).toFixed(1);
  if (unit === '%') return `${sign}${magnitude}%`;
  if (unit === 'mm') return `${sign}${magnitude} mm`;
  return `${sign}${magnitude} points`;
}

/** A 95% confidence interval in its unit: `74.1 to 88.6%`. */
export function formatInterval(ci: readonly [number, number], unit: MeasureUnit): string {
  const [low, high] = ci.map((bound) => formatMeasure(bound, unit).replace(/( mm| points|%)$/, ''));
  const suffix = unit === '%' ? '%' : unit === 'mm' ? ' mm' : ' points';
  return `${low} to ${high}${suffix}`;
}

/** The observed value of a result with its CI and denominator, e.g. `82.4% (95% CI 74.1 to 88.6%; 11 of 14)`. */
export function formatObserved(observed: ObservedStandardValue, unit: MeasureUnit): string {
  const counted = observed.count === null ? `n = ${observed.n}` : `${observed.count} of ${observed.n}`;
  return `${formatMeasure(observed.value, unit)} (95% CI ${formatInterval(observed.ci95, unit)}; ${counted})`;
}

/** The target with its comparator: `≤ 1.0 mm`, `≥ 80.0%`. */
export function formatTarget(standard: Pick<StandardView, 'comparator' | 'target' | 'metric'>): string {
  const symbol = standard.comparator === '<=' ? '≤' : '≥';
  return `${symbol} ${formatMeasure(standard.target, STANDARD_METRIC_INFO[standard.metric].unit)}`;
}

/** The parameters a standard's measure uses, in words (interval, limits, grade); empty when it has none. */
export function standardParameters(standard: StandardView, intervals: readonly RecallInterval[]): string[] {
  const info = STANDARD_METRIC_INFO[standard.metric];
  const words: string[] = [];
  if (info.needsInterval && standard.intervalKey) {
    const interval = intervals.find((candidate) => candidate.key === standard.intervalKey);
    words.push(`At ${interval?.label ?? standard.intervalKey}`);
  }
  if (info.needsThresholdMm && standard.thresholdMm !== null) words.push(`Rebound ≤ ${standard.thresholdMm.toFixed(1)} mm`);
  if (info.needsThresholdPct && standard.thresholdPct !== null) words.push(`Bleeding score under ${standard.thresholdPct}%`);
  if (info.needsGrade && standard.minGrade !== null) words.push(`Grade ${standard.minGrade} or worse`);
  return words;
}

/** A recall interval as the schedule defines it: `6 months (day 182, window −14/+28 days)`. */
export function intervalWords(interval: RecallInterval): string {
  return `${interval.label} (day ${interval.targetDays}, window −${interval.windowBeforeDays}/+${interval.windowAfterDays} days)`;
}

/** A change between cycles and its 95% CI: `+3.2 pp` and `95% CI −4.1 to +10.5`; shares change in percentage points. */
export function formatChange(difference: number, ci: readonly [number, number] | null, unit: MeasureUnit): { change: string; interval: string } {
  const signed = (value: number): string => {
    const rounded = Math.round(value * 10) / 10;
    return `${rounded > 0 ? '+' : rounded < 0 ? '−' : ''}${Math.abs(rounded).toFixed(1)}`;
  };
  const suffix = unit === '%' ? ' pp' : unit === 'mm' ? ' mm' : ' points';
  return { change: `${signed(difference)}${suffix}`, interval: ci ? `95% CI ${signed(ci[0])} to ${signed(ci[1])}` : '' };
}

/** A p value as reports give it: `p = 0.034`, `p < 0.001`. */
export function formatP(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

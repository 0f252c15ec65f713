import type { AuditDataset } from '../shared/types/audit-dataset';
import type { FunnelPoint, FunnelResult } from '../shared/types/audit-results';
import { AnalyticsInputError } from './analytics-input-error';
import { assertArray } from './assert-array';
import { assertAuditDataset } from './assert-audit-dataset';
import { funnelLimits, type FunnelLimits } from './funnel-limits';
import { intervalSiteRebounds } from './interval-site-rebounds';
import { stabilityClass } from './stability-class';

/** Options of {@link operatorFunnel}. */
export interface OperatorFunnelOptions {
  /** Recall interval of the relapse measure (required for 'relapse', ignored for 'complication'). */
  readonly intervalKey?: string;
  /** How an operator appears to the viewer (names or "Operator A"; DESIGN.md §2). */
  readonly labelFor: (operatorId: number) => { label: string; isSelf: boolean };
}

/** Below this many cases or sites the exact binomial limits are used (Spiegelhalter 2005 prefers them for small n). */
export const EXACT_LIMITS_BELOW_N = 30;
/** About this many sizes along the drawn funnel. */
const CURVE_POINTS = 40;
/** Comparison slack, so that a rate equal to a limit in exact arithmetic counts as inside. */
const RATE_TOLERANCE = 1e-12;

/**
 * Funnel plot of operators' rates against the practice rate (Spiegelhalter DJ, Stat Med
 * 2005;24:1185–1202):
 * - 'complication': cases with ≥ 1 complication / cases, per operator (withdrawn cases
 *   included, as in {@link summariseComplications});
 * - 'relapse': sites with rebound > dataset.thresholds.relapse at the interval / sites
 *   measured there ({@link stabilityClass} 'relapse'), per operator of the row.
 * Target θ₀ = Σevents / Σn over all operators (0 when there is no case or site).
 * Limits at 95% and 99.8% by {@link funnelLimits}: the normal approximation
 * θ₀ ± z√(θ₀(1 − θ₀)/n) for n ≥ 30, and the exact binomial limits with interpolation
 * for n < 30, where the normal approximation is poor (so the drawn funnel may step at
 * n = 30). Position: above the 99.8% upper limit 'alarm-high', above the 95% upper
 * 'warning-high', and likewise low; otherwise 'inside'. The curve samples n from 1 to
 * the largest operator's n: every n up to 40, else 40 sizes spaced geometrically.
 * Points are in order of operator id.
 *
 * @param dataset the audit dataset
 * @param measure 'complication' | 'relapse'
 * @param options { intervalKey (for relapse), labelFor }
 * @returns the {@link FunnelResult}
 * @throws {AnalyticsInputError} on an unknown measure, a missing or unknown interval key for 'relapse',
 *   a missing labelFor, or an invalid case or row
 */
export function operatorFunnel(
  dataset: AuditDataset,
  measure: 'complication' | 'relapse',
  options: OperatorFunnelOptions,
): FunnelResult {
  assertAuditDataset(dataset, 'operatorFunnel');
  if (typeof options?.labelFor !== 'function') {
    throw new AnalyticsInputError('operatorFunnel: options.labelFor must be a function (operatorId) => { label, isSelf }');
  }
  let intervalKey: string | null = null;
  const tallies = new Map<number, { events: number; n: number }>();
  const tally = (operatorId: number, isEvent: boolean) => {
    if (typeof operatorId !== 'number' || !Number.isFinite(operatorId)) {
      throw new AnalyticsInputError(`operatorFunnel: operatorId must be a number, got ${String(operatorId)}`);
    }
    const counts = tallies.get(operatorId) ?? { events: 0, n: 0 };
    counts.n++;
    if (isEvent) counts.events++;
    tallies.set(operatorId, counts);
  };
  if (measure === 'complication') {
    dataset.cases.forEach((outcome, i) => {
      assertArray(outcome?.complications, `operatorFunnel: cases[${i}].complications`);
      tally(outcome.operatorId, outcome.complications.length > 0);
    });
  } else if (measure === 'relapse') {
    if (options.intervalKey === undefined) throw new AnalyticsInputError("operatorFunnel: the 'relapse' measure needs options.intervalKey");
    intervalKey = options.intervalKey;
    for (const site of intervalSiteRebounds(dataset, intervalKey, 'operatorFunnel')) {
      tally(site.record.operatorId, stabilityClass(site.rebound, dataset.thresholds) === 'relapse');
    }
  } else {
    throw new AnalyticsInputError(`operatorFunnel: measure must be 'complication' or 'relapse', got ${String(measure)}`);
  }

  const operators = [...tallies.entries()].sort(([a], [b]) => a - b);
  const totalEvents = operators.reduce((sum, [, counts]) => sum + counts.events, 0);
  const totalN = operators.reduce((sum, [, counts]) => sum + counts.n, 0);
  const target = totalN > 0 ? totalEvents / totalN : 0;
  const points: FunnelPoint[] = operators.map(([operatorId, { events, n }]) => {
    const { label, isSelf } = options.labelFor(operatorId);
    const rate = events / n;
    const limits95 = limitsAt(target, n, 0.95);
    const limits998 = limitsAt(target, n, 0.998);
    return { label, isSelf, events, n, rate, limits95, limits998, position: positionOf(rate, limits95, limits998) };
  });
  const maxN = operators.reduce((max, [, counts]) => Math.max(max, counts.n), 0);
  const curve = curveSizes(maxN).map((n) => {
    const limits95 = limitsAt(target, n, 0.95);
    const limits998 = limitsAt(target, n, 0.998);
    return { n, lower95: limits95.lower, upper95: limits95.upper, lower998: limits998.lower, upper998: limits998.upper };
  });
  return { measure, intervalKey, target, totalEvents, totalN, points, curve };
}

/** Funnel limits at n: exact binomial below 30, normal approximation from 30. */
function limitsAt(target: number, n: number, confidence: number): FunnelLimits {
  return funnelLimits(target, n, confidence, { method: n < EXACT_LIMITS_BELOW_N ? 'exact' : 'normal' });
}

function positionOf(rate: number, limits95: FunnelLimits, limits998: FunnelLimits): FunnelPoint['position'] {
  if (rate > limits998.upper + RATE_TOLERANCE) return 'alarm-high';
  if (rate > limits95.upper + RATE_TOLERANCE) return 'warning-high';
  if (rate < limits998.lower - RATE_TOLERANCE) return 'alarm-low';
  if (rate < limits95.lower - RATE_TOLERANCE) return 'warning-low';
  return 'inside';
}

/**
 * Sizes at which the funnel is drawn: 1…maxN when maxN ≤ 40; otherwise 40 sizes from 1 to
 * maxN spaced geometrically (the funnel bends most at small n), each at least one more than
 * the one before so that rounding leaves no duplicates at the small end.
 */
function curveSizes(maxN: number): number[] {
  if (maxN <= CURVE_POINTS) return Array.from({ length: maxN }, (_, i) => i + 1);
  const sizes = [1];
  for (let i = 1; i < CURVE_POINTS; i++) {
    const geometric = Math.round(maxN ** (i / (CURVE_POINTS - 1)));
    sizes.push(Math.min(maxN, Math.max(sizes[i - 1] + 1, geometric)));
  }
  return [...new Set(sizes)];
}

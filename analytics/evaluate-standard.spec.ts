import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { evaluateStandard, type AuditStandard } from './evaluate-standard';
import { wilsonInterval } from './wilson-interval';

// Source: common practice for audit criteria measured with uncertainty — met when the whole 95% CI
// is on the good side of the target, not met when it is wholly on the bad side, else inconclusive.
describe('evaluateStandard', () => {
  const atLeast80: AuditStandard = { comparator: '>=', target: 0.8 };
  const atMost1mm: AuditStandard = { comparator: '<=', target: 1 };

  it("'>=': met, not met and inconclusive", () => {
    expect(evaluateStandard(atLeast80, { value: 0.9, ci95: [0.85, 0.94] }).verdict).toBe('met');
    expect(evaluateStandard(atLeast80, { value: 0.6, ci95: [0.5, 0.7] }).verdict).toBe('not-met');
    expect(evaluateStandard(atLeast80, { value: 0.82, ci95: [0.75, 0.88] }).verdict).toBe('inconclusive');
  });

  it("'<=': met, not met and inconclusive", () => {
    expect(evaluateStandard(atMost1mm, { value: 0.6, ci95: [0.5, 0.7] }).verdict).toBe('met');
    expect(evaluateStandard(atMost1mm, { value: 1.4, ci95: [1.2, 1.6] }).verdict).toBe('not-met');
    expect(evaluateStandard(atMost1mm, { value: 0.95, ci95: [0.8, 1.1] }).verdict).toBe('inconclusive');
  });

  it('a CI touching the target from the good side counts as met', () => {
    expect(evaluateStandard(atLeast80, { value: 0.85, ci95: [0.8, 0.9] }).verdict).toBe('met');
    expect(evaluateStandard(atMost1mm, { value: 0.9, ci95: [0.8, 1] }).verdict).toBe('met');
  });

  it('returns the numbers behind the verdict; works with a Wilson interval', () => {
    // Source for the interval: Newcombe RG, Stat Med 1998;17:857–872, Table I — 81/263: 0.2553–0.3662.
    const { p, lower, upper } = wilsonInterval(81, 263);
    const result = evaluateStandard({ comparator: '<=', target: 0.3 }, { value: p, ci95: [lower, upper] });
    expect(result).toEqual({ verdict: 'inconclusive', value: p, ci95: [lower, upper], target: 0.3, comparator: '<=' });
  });

  it('throws on a bad comparator, non-finite numbers or a CI that misses the value', () => {
    expect(() => evaluateStandard(JSON.parse('{"comparator":">","target":1}'), { value: 1, ci95: [0, 2] })).toThrow(/comparator/);
    expect(() => evaluateStandard(atLeast80, { value: Number.NaN, ci95: [0, 1] })).toThrow(AnalyticsInputError);
    expect(() => evaluateStandard(atLeast80, { value: 0.5, ci95: [0.6, 0.7] })).toThrow(/must contain the value/);
  });
});

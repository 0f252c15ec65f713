import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { AuditCaseRecord } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { operatorFunnel } from './operator-funnel';
import { SMALL_AUDIT, auditCase } from './small-audit-dataset.fixture';

const labelFor = (operatorId: number) => ({ label: `Operator ${operatorId}`, isSelf: operatorId === 7 });

/** `n` cases of one operator, the first `events` of them with a complication. */
function operatorCases(operatorId: number, n: number, events: number, firstId: number): AuditCaseRecord[] {
  return Array.from({ length: n }, (_, i) =>
    auditCase({
      caseId: firstId + i, patientId: firstId + i, operatorId, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never',
      complications: i < events ? [{ type: 'bleeding', grade: 'I' }] : [],
    }),
  );
}

describe('operatorFunnel', () => {
  /*
   * Complications, fixture table: operator 7 has cases 11 (complication), 12, 41 → 1/3;
   * operator 9 has cases 21 (complication), 31 → 1/2; target θ₀ = 2/5 = 0.4.
   * n < 30 → exact binomial limits with Spiegelhalter's interpolation (funnelLimits 'exact'):
   * upper 95% at n = 3: P(R ≤ 2) = 1 − 0.4³ = 0.936 < 0.975 ≤ P(R ≤ 3) = 1, so r = 3,
   * α = (1 − 0.975)/(1 − 0.936) = 0.390625, limit (3 − α)/3 = 0.8697917.
   * n = 2: P(R ≤ 1) = 0.84, r = 2, α = 0.025/0.16 = 0.15625 → 0.921875. n = 1: P(R ≤ 0) = 0.6,
   * r = 1, α = 0.025/0.4 = 0.0625 → 0.9375. Lower 95% limits: r = 0 with P(R ≤ 0) ≥ 0.025, (0 − α)/n < 0 → 0.
   */
  it('complications per operator against the practice rate, with exact limits below n = 30', () => {
    const funnel = operatorFunnel(SMALL_AUDIT, 'complication', { labelFor });
    expect(funnel).toMatchObject({ measure: 'complication', intervalKey: null, target: 0.4, totalEvents: 2, totalN: 5 });
    expect(funnel.points.map((point) => [point.label, point.isSelf, point.events, point.n, point.position])).toEqual([
      ['Operator 7', true, 1, 3, 'inside'],
      ['Operator 9', false, 1, 2, 'inside'],
    ]);
    expect(funnel.points[0].rate).toBeCloseTo(1 / 3, 12);
    expect(funnel.points[0].limits95.upper).toBeCloseTo(0.8697917, 7);
    expect(funnel.points[0].limits95.lower).toBe(0);
    expect(funnel.points[1].limits95.upper).toBeCloseTo(0.921875, 9);
    expect(funnel.curve.map((point) => point.n)).toEqual([1, 2, 3]);
    expect(funnel.curve[0].upper95).toBeCloseTo(0.9375, 9);
  });

  /*
   * Relapse at 6m: operator 7 sites 111 (0.5), 112 (1.5), 121 (1.0) → 1/3; operator 9 sites
   * 211 (1.0), 212 (2.0), 311 (0.5) → 1/3; 1.0 mm is not > 1.0 mm. Target 2/6.
   */
  it('relapse per operator at an interval (rebound > thresholds.relapse)', () => {
    const funnel = operatorFunnel(SMALL_AUDIT, 'relapse', { intervalKey: '6m', labelFor });
    expect(funnel).toMatchObject({ measure: 'relapse', intervalKey: '6m', totalEvents: 2, totalN: 6 });
    expect(funnel.target).toBeCloseTo(1 / 3, 12);
    expect(funnel.points.map((point) => [point.events, point.n])).toEqual([[1, 3], [1, 3]]);
  });

  /*
   * Spiegelhalter 2005, normal approximation, θ₀ = 0.10, n = 100 (REFERENCES.md A6):
   * 99.8% 0.0073–0.1927, 95% 0.0412–0.1588. Five operators of 100 cases with 19, 1, 10, 20, 0
   * complications: 50/500 = 0.10 → 0.19 warning-high, 0.01 warning-low, 0.10 inside,
   * 0.20 alarm-high, 0 alarm-low.
   */
  it('n ≥ 30 uses the normal limits (Spiegelhalter 2005 values) and classifies each operator', () => {
    const cases = [
      ...operatorCases(1, 100, 19, 1000), ...operatorCases(2, 100, 1, 2000), ...operatorCases(3, 100, 10, 3000),
      ...operatorCases(4, 100, 20, 4000), ...operatorCases(5, 100, 0, 5000),
    ];
    const funnel = operatorFunnel({ ...SMALL_AUDIT, records: [], cases }, 'complication', { labelFor });
    expect(funnel.target).toBeCloseTo(0.1, 12);
    const first = funnel.points[0];
    expect(first.limits95.lower).toBeCloseTo(0.0412, 4);
    expect(first.limits95.upper).toBeCloseTo(0.1588, 4);
    expect(first.limits998.lower).toBeCloseTo(0.0073, 4);
    expect(first.limits998.upper).toBeCloseTo(0.1927, 4);
    expect(funnel.points.map((point) => point.position)).toEqual(['warning-high', 'warning-low', 'inside', 'alarm-high', 'alarm-low']);
    // The drawn funnel: 40 increasing sizes from 1 to 100, the same limits at n = 100.
    expect(funnel.curve[0].n).toBe(1);
    expect(funnel.curve[funnel.curve.length - 1]).toMatchObject({ n: 100 });
    expect(funnel.curve[funnel.curve.length - 1].upper95).toBeCloseTo(0.1588, 4);
    expect(funnel.curve).toHaveLength(40);
    funnel.curve.slice(1).forEach((point, i) => expect(point.n).toBeGreaterThan(funnel.curve[i].n));
  });

  it('events and n add up to the totals, and every rate sits between 0 and 1 (property)', () => {
    const operator = fc.record({ n: fc.integer({ min: 1, max: 40 }), share: fc.double({ min: 0, max: 1, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(operator, { minLength: 1, maxLength: 5 }), (operators) => {
        const cases = operators.flatMap(({ n, share }, i) => operatorCases(i + 1, n, Math.round(share * n), (i + 1) * 100));
        const funnel = operatorFunnel({ ...SMALL_AUDIT, records: [], cases }, 'complication', { labelFor });
        expect(funnel.points.reduce((sum, point) => sum + point.events, 0)).toBe(funnel.totalEvents);
        expect(funnel.points.reduce((sum, point) => sum + point.n, 0)).toBe(funnel.totalN);
        for (const point of funnel.points) {
          expect(point.limits998.lower).toBeLessThanOrEqual(point.limits95.lower + 1e-12);
          expect(point.limits998.upper).toBeGreaterThanOrEqual(point.limits95.upper - 1e-12);
        }
      }),
      { numRuns: 50 },
    );
  });

  it('an empty cohort gives no points and target 0', () => {
    expect(operatorFunnel({ ...SMALL_AUDIT, cases: [] }, 'complication', { labelFor })).toMatchObject({ target: 0, totalN: 0, points: [], curve: [] });
  });

  it('rejects relapse without an interval, an unknown interval or measure, and a missing labelFor', () => {
    expect(() => operatorFunnel(SMALL_AUDIT, 'relapse', { labelFor })).toThrow(/needs options.intervalKey/);
    expect(() => operatorFunnel(SMALL_AUDIT, 'relapse', { intervalKey: '9m', labelFor })).toThrow(AnalyticsInputError);
    expect(() => operatorFunnel(SMALL_AUDIT, JSON.parse('"mortality"'), { labelFor })).toThrow(/measure must be/);
    expect(() => operatorFunnel(SMALL_AUDIT, 'complication', JSON.parse('{}'))).toThrow(/labelFor must be a function/);
  });
});

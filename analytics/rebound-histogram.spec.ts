import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { reboundHistogram } from './rebound-histogram';
import { SMALL_AUDIT, auditCase, siteRecord } from './small-audit-dataset.fixture';

const OWNER = auditCase({ caseId: 1, patientId: 1, operatorId: 1, surgeryDate: '2024-01-01', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never' });
/** A dataset whose sites have these rebounds at 6m (post-op 10 mm, recall 10 − rebound). */
const withRebounds = (rebounds: readonly number[]) => ({
  ...SMALL_AUDIT,
  cases: [OWNER],
  records: rebounds.map((value, i) => siteRecord(OWNER, { siteId: i + 1, intervalKey: '6m', visitDate: '2024-07-01', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 10 - value })),
});

describe('reboundHistogram', () => {
  it('6m of the fixture: 0.5, 1.5, 1.0, 1.0, 2.0, 0.5 → ⌊0.5⌋ = 0 to ⌈2.0⌉ = 2 in (from, to] bins: 2, 2, 1, 1', () => {
    expect(reboundHistogram(SMALL_AUDIT, '6m')).toEqual({
      intervalKey: '6m',
      bins: [{ from: 0, to: 0.5, count: 2 }, { from: 0.5, to: 1, count: 2 }, { from: 1, to: 1.5, count: 1 }, { from: 1.5, to: 2, count: 1 }],
    });
  });

  it('6w of the fixture: −0.5, 0.5, 0.0, 1.5 → −1 to 2: the lowest edge closes the first bin (R hist include.lowest)', () => {
    expect(reboundHistogram(SMALL_AUDIT, '6w').bins.map((bin) => [bin.from, bin.to, bin.count])).toEqual([
      [-1, -0.5, 1], [-0.5, 0, 1], [0, 0.5, 1], [0.5, 1, 0], [1, 1.5, 1], [1.5, 2, 0],
    ]);
  });

  it('the lowest value sits in the first bin when it is a whole millimetre (0 → [0, 0.5])', () => {
    expect(reboundHistogram(withRebounds([0, 0.5, 1]), '6m').bins.map((bin) => bin.count)).toEqual([2, 1]);
  });

  it('one bin when every site has the same whole-millimetre rebound; none without sites', () => {
    expect(reboundHistogram(withRebounds([1, 1]), '6m').bins).toEqual([{ from: 1, to: 1.5, count: 2 }]);
    expect(reboundHistogram(SMALL_AUDIT, '12m')).toEqual({ intervalKey: '12m', bins: [] });
  });

  it('other widths: 1 mm bins over 0.5 … 2.0 → (0, 1] 4, (1, 2] 2', () => {
    expect(reboundHistogram(SMALL_AUDIT, '6m', 1).bins.map((bin) => [bin.from, bin.to, bin.count])).toEqual([[0, 1, 4], [1, 2, 2]]);
  });

  it('counts every site once, in contiguous bins covering every value (property)', () => {
    const halfSteps = fc.integer({ min: -10, max: 10 }).map((steps) => steps / 2);
    fc.assert(
      fc.property(fc.array(halfSteps, { minLength: 1, maxLength: 30 }), (rebounds) => {
        const { bins } = reboundHistogram(withRebounds(rebounds), '6m');
        expect(bins.reduce((sum, bin) => sum + bin.count, 0)).toBe(rebounds.length);
        bins.slice(1).forEach((bin, i) => expect(bin.from).toBe(bins[i].to));
        expect(bins[0].from).toBeLessThanOrEqual(Math.min(...rebounds));
        expect(bins[bins.length - 1].to).toBeGreaterThanOrEqual(Math.max(...rebounds));
      }),
    );
  });

  it('rejects an unknown interval, a width ≤ 0 and a width giving too many bins', () => {
    expect(() => reboundHistogram(SMALL_AUDIT, '9m')).toThrow(AnalyticsInputError);
    expect(() => reboundHistogram(SMALL_AUDIT, '6m', 0)).toThrow(/binWidthMm must be a positive number/);
    expect(() => reboundHistogram(SMALL_AUDIT, '6m', 0.001)).toThrow(/more than 1000/);
  });
});

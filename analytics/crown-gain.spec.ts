import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { crownGain } from './crown-gain';
import { rebound } from './rebound';
import { retainedGain } from './retained-gain';

// Source: DESIGN.md §3 conventions (common practice): crown gain = REF→GM(post-op) − REF→GM(baseline).
describe('crownGain', () => {
  it('is post-op minus baseline', () => {
    // Computed (hand calculation): 10.5 − 8 = 2.5 mm.
    expect(crownGain(8, 10.5)).toBe(2.5);
    expect(crownGain(8, 8)).toBe(0);
  });

  it('rejects NaN, non-finite, negative and implausible values', () => {
    expect(() => crownGain(Number.NaN, 10)).toThrow(AnalyticsInputError);
    expect(() => crownGain(8, Number.POSITIVE_INFINITY)).toThrow(/post-op REF→GM must be a finite number/);
    expect(() => crownGain(-1, 10)).toThrow(/baseline REF→GM must lie between 0 and 20 mm/);
    expect(() => crownGain(8, 25)).toThrow(AnalyticsInputError);
  });

  it('property: rebound + retained gain = crown gain', () => {
    const mm = fc.double({ min: 0, max: 20, noNaN: true });
    fc.assert(
      fc.property(mm, mm, mm, (baseline, postOp, recall) => {
        const sum = rebound(postOp, recall) + retainedGain(baseline, recall);
        return Math.abs(sum - crownGain(baseline, postOp)) < 1e-12;
      }),
    );
  });

  it('the identity is exact on the 0.5 mm grid used chairside', () => {
    const halfMm = fc.integer({ min: 0, max: 40 }).map((steps) => steps / 2);
    fc.assert(
      fc.property(halfMm, halfMm, halfMm, (baseline, postOp, recall) =>
        rebound(postOp, recall) + retainedGain(baseline, recall) === crownGain(baseline, postOp),
      ),
    );
  });
});

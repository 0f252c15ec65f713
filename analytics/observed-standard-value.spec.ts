import { describe, expect, it } from 'vitest';
import { observedStandardValue } from './observed-standard-value';

describe('observedStandardValue', () => {
  it('a share in % with the Wilson interval ×100 (Newcombe 1998, Table I: 81/263 → 0.2553–0.3662)', () => {
    const observed = observedStandardValue({ kind: 'share', count: 81, n: 263 });
    expect(observed?.value).toBeCloseTo((81 / 263) * 100, 10);
    expect(observed?.ci95[0]).toBeCloseTo(25.53, 2);
    expect(observed?.ci95[1]).toBeCloseTo(36.62, 2);
    expect(observed).toMatchObject({ n: 263, count: 81 });
  });

  it('a mean with its t interval (hand: 1.0, 1.5, 0.5 → mean 1, SD 0.5, SE 0.288675, t(0.975, 2) = 4.302653 → ±1.242069)', () => {
    const observed = observedStandardValue({ kind: 'mean', values: [1, 1.5, 0.5] });
    expect(observed?.value).toBeCloseTo(1, 12);
    expect(observed?.ci95[0]).toBeCloseTo(1 - 1.242069, 5);
    expect(observed?.ci95[1]).toBeCloseTo(1 + 1.242069, 5);
    expect(observed).toMatchObject({ n: 3, count: null });
  });

  it('no observed value with n = 0 for a share or fewer than 2 patients for a mean', () => {
    expect(observedStandardValue({ kind: 'share', count: 0, n: 0 })).toBeNull();
    expect(observedStandardValue({ kind: 'mean', values: [0.5] })).toBeNull();
  });
});

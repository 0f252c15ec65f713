import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { selectKth } from './select-kth';

describe('selectKth', () => {
  it('puts the k-th smallest value at k, smaller before and larger after', () => {
    const values = Float64Array.of(5, 1, 4, 2, 3);
    selectKth(values, 2);
    expect(values[2]).toBe(3);
    expect([...values.subarray(0, 2)].every((v) => v <= 3)).toBe(true);
    expect([...values.subarray(3)].every((v) => v >= 3)).toBe(true);
  });

  it('property: agrees with a full sort, including many ties and large arrays (sampling path)', () => {
    const values = fc.oneof(
      fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 1, maxLength: 3000 }),
      fc.array(fc.integer({ min: 0, max: 8 }).map((steps) => steps / 2), { minLength: 1, maxLength: 3000 }),
    );
    fc.assert(
      fc.property(values, fc.double({ min: 0, max: 1, noNaN: true }), (list, fraction) => {
        const work = Float64Array.from(list);
        const sorted = Float64Array.from(list).sort();
        const k = Math.min(list.length - 1, Math.floor(fraction * list.length));
        selectKth(work, k);
        if (work[k] !== sorted[k]) return false;
        for (let i = 0; i < k; i++) if (work[i] > work[k]) return false;
        for (let i = k + 1; i < work.length; i++) if (work[i] < work[k]) return false;
        return true;
      }),
      { numRuns: 200 },
    );
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DistinctIdCounter } from './distinct-id-counter';

describe('DistinctIdCounter', () => {
  it('counts each id once, across word boundaries and growth', () => {
    const counter = new DistinctIdCounter();
    for (const id of [0, 31, 32, 31, 0, 1_000_000, 1_000_000]) counter.add(id);
    expect(counter.size).toBe(4);
  });

  it('falls back to a Set for negative, fractional and very large ids', () => {
    const counter = new DistinctIdCounter();
    for (const id of [-1, -1, 2.5, 2 ** 40, 2 ** 40, 7]) counter.add(id);
    expect(counter.size).toBe(4);
  });

  it('property: agrees with a Set', () => {
    const id = fc.oneof(fc.integer({ min: 0, max: 5000 }), fc.integer({ min: -50, max: 2 ** 30 }), fc.double({ noNaN: true }));
    fc.assert(
      fc.property(fc.array(id, { maxLength: 300 }), (ids) => {
        const counter = new DistinctIdCounter();
        ids.forEach((value) => counter.add(value));
        return counter.size === new Set(ids).size;
      }),
    );
  });
});

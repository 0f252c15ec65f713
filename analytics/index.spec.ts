import { describe, expect, it } from 'vitest';
import * as analytics from './index';

describe('analytics public surface', () => {
  it('exports every function named in the issue', () => {
    const names = [
      'describe', 'wilsonInterval', 'welchTTest', 'rankSumTest', 'fisherExact2x2', 'chiSquare2x2', 'pChart',
      'xmrChart', 'funnelLimits', 'bernoulliCusum', 'kaplanMeier', 'cohenKappa', 'blandAltman', 'icc',
      'crownGain', 'rebound', 'retainedGain', 'percentRetained', 'stabilityClass', 'isValidFdiTooth',
      'summariseOutcomes', 'evaluateStandard',
    ];
    const exported = new Map<string, unknown>(Object.entries(analytics));
    for (const name of names) expect(typeof exported.get(name), name).toBe('function');
  });

  it('is reachable through the @tidemark/analytics alias', async () => {
    const viaAlias = await import('@tidemark/analytics');
    expect(viaAlias.describe).toBe(analytics.describe);
  });
});

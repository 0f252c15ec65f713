import { countsLine, formatMm, formatNumber, formatProportion, formatShare } from './result-format';

describe('result formatting', () => {
  it('prints a true minus sign and never a negative zero', () => {
    expect(formatNumber(-0.25, 2)).toBe('−0.25');
    expect(formatNumber(-0.001, 2)).toBe('0.00');
    expect(formatMm(0.7712)).toBe('0.77 mm');
    expect(formatMm(null)).toBe('—');
  });

  it('prints shares and Wilson intervals in percent', () => {
    expect(formatShare(0.4985)).toBe('49.9%');
    expect(formatProportion({ count: 169, n: 339, p: 0.49853, lower: 0.44562, upper: 0.55147 })).toBe('49.9% (44.6 to 55.1%)');
    expect(formatProportion({ count: 0, n: 0, p: null, lower: null, upper: null })).toBe('—');
  });

  it('writes the counts line with singulars and leaves out what is not given', () => {
    expect(countsLine({ sites: 339, patients: 1, cases: 93 })).toBe('339 sites · 1 patient · 93 cases');
    expect(countsLine({ cases: 12 })).toBe('12 cases');
  });
});

import { describe, expect, it } from 'vitest';
import { AnalyticsInputError } from './analytics-input-error';
import { landisKochBand } from './landis-koch-band';

// Source: Landis JR, Koch GG, Biometrics 1977;33:159–174 — < 0 poor; 0–0.20 slight; 0.21–0.40 fair;
// 0.41–0.60 moderate; 0.61–0.80 substantial; 0.81–1.00 almost perfect.
describe('landisKochBand', () => {
  it.each([
    [-0.1, 'poor'],
    [0, 'slight'],
    [0.2, 'slight'],
    [0.21, 'fair'],
    [0.4, 'fair'],
    [0.41, 'moderate'],
    [0.6, 'moderate'],
    [0.61, 'substantial'],
    [0.8, 'substantial'],
    [0.81, 'almost perfect'],
    [1, 'almost perfect'],
  ])('κ = %s → %s', (kappa, band) => {
    expect(landisKochBand(kappa)).toBe(band);
  });

  it('is not thrown over a band edge by rounding noise', () => {
    expect(landisKochBand(0.4 + 1e-15)).toBe('fair');
    expect(landisKochBand(0.6 - 1e-15)).toBe('moderate');
  });

  it('throws on NaN and values outside [−1, 1]', () => {
    expect(() => landisKochBand(Number.NaN)).toThrow(AnalyticsInputError);
    expect(() => landisKochBand(1.5)).toThrow(/\[−1, 1\]/);
  });
});

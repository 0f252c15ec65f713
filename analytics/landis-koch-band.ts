import { AnalyticsInputError } from './analytics-input-error';

/** Landis & Koch (1977) strength-of-agreement label. */
export type AgreementBand = 'poor' | 'slight' | 'fair' | 'moderate' | 'substantial' | 'almost perfect';

/** Kappa is rounded to this many decimals before banding, so 0.4 − 1e-16 is still "fair". */
const BAND_DECIMALS = 10;

/**
 * Landis JR, Koch GG, Biometrics 1977;33:159–174 bands for kappa:
 * < 0 poor; 0–0.20 slight; 0.21–0.40 fair; 0.41–0.60 moderate; 0.61–0.80 substantial;
 * 0.81–1.00 almost perfect. Upper bounds are inclusive (0.40 is fair).
 *
 * @param kappa a kappa value (−1 ≤ κ ≤ 1)
 * @returns the band label
 * @throws {AnalyticsInputError} when kappa is NaN or outside [−1, 1]
 */
export function landisKochBand(kappa: number): AgreementBand {
  if (typeof kappa !== 'number' || !(kappa >= -1 - 1e-12 && kappa <= 1 + 1e-12)) {
    throw new AnalyticsInputError(`landisKochBand: kappa must lie in [−1, 1], got ${String(kappa)}`);
  }
  const rounded = Number(kappa.toFixed(BAND_DECIMALS));
  if (rounded < 0) return 'poor';
  if (rounded <= 0.2) return 'slight';
  if (rounded <= 0.4) return 'fair';
  if (rounded <= 0.6) return 'moderate';
  if (rounded <= 0.8) return 'substantial';
  return 'almost perfect';
}

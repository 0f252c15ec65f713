import { describe, expect, it } from 'vitest';
import type { CalibrationPair } from '../shared/types/audit-dataset';
import { AnalyticsInputError } from './analytics-input-error';
import { calibrationAgreement } from './calibration-agreement';

const pairsOf = (readings: readonly (readonly [number, number])[]): CalibrationPair[] =>
  readings.map(([first, second], i) => ({ siteId: i + 1, measuredOn: '2024-05-02', first, second, isSameExaminer: true }));

describe('calibrationAgreement', () => {
  /*
   * Hand calculation. Pairs (first, second): (2, 2), (2, 2.5), (2.5, 2.5), (2.5, 3), (3, 3), (3, 3).
   * Within ±1 mm: all 6 (largest difference 0.5 mm).
   * Kappa: categories 2.0, 2.5, 3.0 (k = 3); linear agreement weights 1, 0.5, 0 (Cohen 1968).
   *   Table rows = first, columns = second: [1 1 0; 0 1 1; 0 0 2]; row totals 2, 2, 2; column totals 1, 2, 3.
   *   pₒ = (1 + 1 + 2)/6 + 0.5·(1 + 1)/6 = 5/6; pₑ = Σ w·rᵢ·cⱼ / 36 = 2·(1·1.5 + 2·2 + 3·1.5)/36 = 20/36 = 5/9;
   *   κ = (5/6 − 5/9)/(1 − 5/9) = 5/8 = 0.625, 'substantial' (Landis & Koch 1977).
   * ICC (Shrout & Fleiss 1979): row means 2, 2.25, 2.5, 2.75, 3, 3; grand mean 31/12; column means 2.5, 8/3.
   *   SS targets = 2·Σ(row mean − 31/12)² = 5/3 → BMS = 1/3; SS raters = 6·2·(1/12)² = 1/12 → JMS = 1/12;
   *   SS total = 23/12 → SS error = 23/12 − 5/3 − 1/12 = 1/6 → EMS = 1/30.
   *   ICC(3,1) = (1/3 − 1/30)/(1/3 + 1/30) = 9/11; ICC(2,1) = (3/10)/(11/30 + 2(1/12 − 1/30)/6) = 18/23.
   * Bland–Altman (first − second): 0, −0.5, 0, −0.5, 0, 0 → bias −1/6, SD √(1/15) = 0.258199,
   *   limits −1/6 ± 1.96·0.258199 = −0.672736 to 0.339403.
   */
  it('hand-worked example: within ±1 mm, weighted kappa, ICCs and Bland–Altman', () => {
    const result = calibrationAgreement(pairsOf([[2, 2], [2, 2.5], [2.5, 2.5], [2.5, 3], [3, 3], [3, 3]]));
    expect(result.pairs).toBe(6);
    expect(result.withinOneMm).toMatchObject({ count: 6, n: 6, p: 1 });
    expect(result.kappa?.kappa).toBeCloseTo(0.625, 12);
    expect(result.kappa).toMatchObject({ band: 'substantial', weights: 'linear' });
    expect(result.icc?.icc31).toBeCloseTo(9 / 11, 12);
    expect(result.icc?.icc21).toBeCloseTo(18 / 23, 12);
    expect(result.blandAltman?.bias).toBeCloseTo(-1 / 6, 12);
    expect(result.blandAltman?.sd).toBeCloseTo(0.258199, 6);
    expect(result.blandAltman?.lower).toBeCloseTo(-0.672736, 5);
    expect(result.blandAltman?.upper).toBeCloseTo(0.339403, 5);
    expect(result.meetsCalibrationTarget).toBe(true);
  });

  /*
   * Andrade et al. 2012 targets: > 90% within ±1 mm and κ > 0.6. Pairs (4, 4), (4, 5.5), (5, 5), (6, 6), (7, 7):
   * 4 of 5 = 80% within ±1 mm (the 1.5 mm pair is out) → target not met whatever kappa is.
   */
  it('misses the calibration target when 90% or fewer pairs agree within ±1 mm', () => {
    const result = calibrationAgreement(pairsOf([[4, 4], [4, 5.5], [5, 5], [6, 6], [7, 7]]));
    expect(result.withinOneMm).toMatchObject({ count: 4, n: 5, p: 0.8 });
    expect(result.meetsCalibrationTarget).toBe(false);
  });

  it('exactly 1 mm apart still agrees; 1.5 mm does not', () => {
    expect(calibrationAgreement(pairsOf([[4, 5], [4, 5.5]])).withinOneMm).toMatchObject({ count: 1, n: 2 });
  });

  it('rounds readings to the nearest 0.5 mm category (2.2 → 2.0 and 2.3 → 2.5 give the same table as the hand example)', () => {
    const rounded = calibrationAgreement(pairsOf([[2.2, 2], [2, 2.3], [2.5, 2.5], [2.5, 3], [3, 3], [3, 3]]));
    expect(rounded.kappa?.kappa).toBeCloseTo(0.625, 12);
  });

  /*
   * Bland & Altman 1986 (REFERENCES.md A8), Wright vs mini Wright peak flow scaled by 1/100 into mm:
   * bias −2.1/100 = −0.021, SD 38.8/100 = 0.388 (published to 1 decimal of l/min).
   */
  it('Bland–Altman composition reproduces the published bias and SD (values /100)', () => {
    const wright = [494, 395, 516, 434, 476, 557, 413, 442, 650, 433, 417, 656, 267, 478, 178, 423, 427];
    const mini = [512, 430, 520, 428, 500, 600, 364, 380, 658, 445, 432, 626, 260, 477, 259, 350, 451];
    const result = calibrationAgreement(pairsOf(wright.map((value, i) => [value / 100, mini[i] / 100])));
    expect(result.blandAltman?.bias).toBeCloseTo(-0.021, 3);
    expect(result.blandAltman?.sd).toBeCloseTo(0.388, 3);
  });

  it('fewer than 2 pairs: only the within-±1 mm share', () => {
    expect(calibrationAgreement([])).toEqual({
      pairs: 0, withinOneMm: { count: 0, n: 0, p: null, lower: null, upper: null }, kappa: null, icc: null, blandAltman: null, meetsCalibrationTarget: null,
    });
    expect(calibrationAgreement(pairsOf([[3, 3]]))).toMatchObject({ pairs: 1, withinOneMm: { count: 1, n: 1 }, kappa: null, icc: null, meetsCalibrationTarget: null });
  });

  it('identical readings throughout: kappa and ICC undefined (null), bias 0', () => {
    const result = calibrationAgreement(pairsOf([[3, 3], [3, 3], [3, 3]]));
    expect(result).toMatchObject({ kappa: null, icc: null, meetsCalibrationTarget: null, blandAltman: { bias: 0, sd: 0 } });
  });

  it('rejects implausible readings', () => {
    expect(() => calibrationAgreement(pairsOf([[3, 3], [3, 25]]))).toThrow(/pairs\[1\].second must lie between 0 and 20 mm/);
    expect(() => calibrationAgreement(JSON.parse('{}'))).toThrow(AnalyticsInputError);
  });
});

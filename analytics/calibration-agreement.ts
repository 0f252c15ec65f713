import type { CalibrationResult } from '../shared/types/audit-results';
import type { CalibrationPair } from '../shared/types/audit-dataset';
import { assertArray } from './assert-array';
import { assertMillimetres } from './assert-millimetres';
import { blandAltman } from './bland-altman';
import { cohenKappa } from './cohen-kappa';
import { icc } from './icc';
import { proportionEstimate } from './proportion-estimate';

/** Readings within this many mm of each other agree (probe reproducibility, REFERENCES.md §B). */
const AGREEMENT_MM = 1;
/** Category width for kappa: the probe's 0.5 mm reading step (DESIGN.md §3). */
const CATEGORY_MM = 0.5;
/** Calibration targets of Andrade R et al., Braz Oral Res 2012;26(1):57–63. */
const TARGET_WITHIN_ONE_MM = 0.9;
const TARGET_KAPPA = 0.6;
/** Floating-point slack in mm. */
const TOLERANCE_MM = 1e-9;

/**
 * Agreement of repeated REF→GM readings (examiner calibration, DESIGN.md §4):
 * - within ±1 mm: pairs with |first − second| ≤ 1 mm, with Wilson 95% interval;
 * - weighted kappa with linear weights ({@link cohenKappa}; Cohen 1968) on readings
 *   put into 0.5 mm categories (each reading rounded to the nearest 0.5 mm step) spanning
 *   the observed range, from the lowest to the highest step read by either examiner; null when all readings
 *   fall into one category (kappa undefined);
 * - ICC(2,1) and ICC(3,1) ({@link icc}; Shrout & Fleiss 1979) on rows [first, second];
 *   null when every pair is the same pair of readings (no variance to share out);
 * - Bland–Altman bias and 95% limits of first − second ({@link blandAltman}; Bland & Altman 1986);
 * - meetsCalibrationTarget: > 90% within ±1 mm and κ > 0.6 (Andrade et al. 2012); null
 *   when kappa is undefined.
 * With fewer than 2 pairs only the within-±1 mm share is given; everything else is null.
 *
 * @param pairs repeated readings, mm (0–20)
 * @returns the {@link CalibrationResult}
 * @throws {AnalyticsInputError} when pairs is not an array or a reading is not a plausible number of mm
 * @example
 * calibrationAgreement(pairs); // { pairs: 6, withinOneMm: { p: 1, … }, kappa: { kappa: 0.625, band: 'substantial', … }, … }
 */
export function calibrationAgreement(pairs: readonly CalibrationPair[]): CalibrationResult {
  assertArray(pairs, 'calibrationAgreement: pairs');
  const first: number[] = [];
  const second: number[] = [];
  pairs.forEach((pair, i) => {
    assertMillimetres(pair?.first, `calibrationAgreement: pairs[${i}].first`);
    assertMillimetres(pair.second, `calibrationAgreement: pairs[${i}].second`);
    first.push(pair.first);
    second.push(pair.second);
  });
  const within = first.filter((value, i) => Math.abs(value - second[i]) <= AGREEMENT_MM + TOLERANCE_MM).length;
  const withinOneMm = proportionEstimate(within, pairs.length);
  if (pairs.length < 2) {
    return { pairs: pairs.length, withinOneMm, kappa: null, icc: null, blandAltman: null, meetsCalibrationTarget: null };
  }

  const kappa = weightedKappa(first, second);
  const isOnePairRepeated = first.every((value, i) => value === first[0] && second[i] === second[0]);
  const intraclass = isOnePairRepeated ? null : icc(first.map((value, i) => [value, second[i]]));
  const { bias, sd, lower, upper } = blandAltman(first, second);
  return {
    pairs: pairs.length,
    withinOneMm,
    kappa,
    icc: intraclass === null ? null : { icc21: intraclass.icc21.value, icc31: intraclass.icc31.value },
    blandAltman: { bias, sd, lower, upper },
    meetsCalibrationTarget: kappa === null || withinOneMm.p === null ? null : withinOneMm.p > TARGET_WITHIN_ONE_MM && kappa.kappa > TARGET_KAPPA,
  };
}

/** Linear weighted kappa on 0.5 mm categories spanning the observed range; null with one category. */
function weightedKappa(first: readonly number[], second: readonly number[]): CalibrationResult['kappa'] {
  const readings = [...first, ...second];
  // Each reading goes to the nearest 0.5 mm step; categories run from the lowest step read to the highest.
  const lowestStep = Math.round(Math.min(...readings) / CATEGORY_MM);
  const categoryOf = (value: number) => Math.round(value / CATEGORY_MM) - lowestStep;
  const categories = categoryOf(Math.max(...readings)) + 1;
  if (categories < 2) return null;
  const table = Array.from({ length: categories }, () => new Array<number>(categories).fill(0));
  first.forEach((value, i) => table[categoryOf(value)][categoryOf(second[i])]++);
  const { kappa, band } = cohenKappa(table, 'linear');
  return { kappa, band, weights: 'linear' };
}

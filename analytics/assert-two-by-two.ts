import { AnalyticsInputError } from './analytics-input-error';
import { assertCount } from './assert-count';
import { assertArray } from './assert-array';

/** A 2×2 contingency table [[a, b], [c, d]]: rows = groups, columns = event / no event. */
export type TwoByTwoTable = readonly [readonly [number, number], readonly [number, number]];

/**
 * Checks that a 2×2 table holds non-negative integer counts and is not empty.
 *
 * @param table the table
 * @param label name used in the error message
 * @throws {AnalyticsInputError} when the shape is wrong, a count is invalid or all counts are 0
 */
export function assertTwoByTwo(table: TwoByTwoTable, label: string): void {
  const shapeMessage = `${label}: table must be 2×2, [[a, b], [c, d]]`;
  assertArray(table, shapeMessage);
  table.forEach((row) => assertArray(row, shapeMessage));
  if (table.length !== 2 || table.some((row) => row.length !== 2)) throw new AnalyticsInputError(shapeMessage);
  table.forEach((row, i) => row.forEach((count, j) => assertCount(count, `${label}: table[${i}][${j}]`)));
  if (table[0][0] + table[0][1] + table[1][0] + table[1][1] === 0) {
    throw new AnalyticsInputError(`${label}: table has no observations`);
  }
}

import type { DescriptiveStatistics, IntervalOutcomeSummary, ProportionEstimate } from '@tidemark/shared';
import type { PackSubgroup } from './governance-pack';
import type { TableColumn } from './table-sheet';

/** One row: a subgroup at one interval. */
export interface SubgroupInterval {
  readonly subgroup: PackSubgroup;
  readonly interval: IntervalOutcomeSummary;
}

/** Every subgroup's intervals in order: the row source of the Margin outcomes and Papilla sheets. */
export function* subgroupIntervals(subgroups: readonly PackSubgroup[]): Iterable<SubgroupInterval> {
  for (const subgroup of subgroups) for (const interval of subgroup.summary.intervals) yield { subgroup, interval };
}

/** Mean, CI and SD columns of one descriptive summary (mm). */
export function meanColumns(title: string, pick: (row: SubgroupInterval) => DescriptiveStatistics | null, format: 'meanMm' | 'score'): TableColumn<SubgroupInterval>[] {
  return [
    { header: `${title}: mean`, width: 12, format, value: (row) => pick(row)?.mean ?? null },
    { header: `${title}: 95% CI low`, width: 12, format, value: (row) => pick(row)?.ci95?.[0] ?? null },
    { header: `${title}: 95% CI high`, width: 12, format, value: (row) => pick(row)?.ci95?.[1] ?? null },
  ];
}

/** Share (as a fraction) with its Wilson limits. */
export function shareColumns<Row>(title: string, pick: (row: Row) => ProportionEstimate): TableColumn<Row>[] {
  return [
    { header: `${title}: %`, width: 10, format: 'share', value: (row) => pick(row).p },
    { header: `${title}: 95% CI low`, width: 11, format: 'share', value: (row) => pick(row).lower },
    { header: `${title}: 95% CI high`, width: 11, format: 'share', value: (row) => pick(row).upper },
  ];
}

/** The columns that name a row (kept in view while scrolling right). */
export const SUBGROUP_COLUMNS: TableColumn<SubgroupInterval>[] = [
  { header: 'Subgroup by', width: 14, value: (row) => row.subgroup.dimension },
  { header: 'Subgroup', width: 30, value: (row) => row.subgroup.label },
  { header: 'Interval', width: 12, value: (row) => row.interval.label },
];

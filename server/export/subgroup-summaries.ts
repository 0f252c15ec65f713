import type { AuditDataset, GroupBy, OutcomeSummary } from '@tidemark/shared';
import { INDICATION_LABELS, PHENOTYPE_LABELS, PROCEDURE_LABELS, SMOKING_LABELS } from '@tidemark/shared';
import { groupDataset, NOT_RECORDED_KEY } from '@tidemark/analytics';
import type { PackSubgroup } from './governance-pack';
import { summariseDataset } from './snapshot-results';

/** The subgroup views of the Results screen, in the order the workbook lists them. */
const DIMENSIONS: readonly { groupBy: GroupBy; title: string; labels: Readonly<Record<string, string>> | null }[] = [
  { groupBy: 'operator', title: 'Operator', labels: null },
  { groupBy: 'phenotype', title: 'Phenotype', labels: PHENOTYPE_LABELS },
  { groupBy: 'procedure', title: 'Procedure', labels: PROCEDURE_LABELS },
  { groupBy: 'indication', title: 'Indication', labels: INDICATION_LABELS },
  { groupBy: 'smoking', title: 'Smoking', labels: SMOKING_LABELS },
];

/**
 * The whole cohort and every subgroup (operator, phenotype, procedure, indication, smoking),
 * each summarised by analytics' summariseOutcomes after groupDataset — as the results service
 * does for `?groupBy=` — with operators as letters whoever asks.
 */
export function subgroupSummaries(dataset: AuditDataset, overall: OutcomeSummary, operatorLetter: (operatorId: number) => string): PackSubgroup[] {
  const subgroups: PackSubgroup[] = [{ dimension: 'All cases', label: 'All cases', summary: overall }];
  for (const dimension of DIMENSIONS) {
    for (const group of groupDataset(dataset, dimension.groupBy)) {
      const label =
        dimension.labels === null
          ? `Operator ${operatorLetter(Number(group.key))}`
          : group.key === NOT_RECORDED_KEY
            ? 'Not recorded'
            : (dimension.labels[group.key] ?? group.key);
      subgroups.push({ dimension: dimension.title, label, summary: summariseDataset(group.dataset) });
    }
  }
  return subgroups;
}

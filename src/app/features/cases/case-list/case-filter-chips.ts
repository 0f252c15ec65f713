import { CASE_STATUS_LABELS, PHENOTYPE_LABELS, PROCEDURE_LABELS, type CaseListQuery, type OperatorView } from '@tidemark/shared';
import { CASE_LIST_FILTERS } from './case-list-query';
import { formatLocalDate } from '../../../shared/dates/local-date';

/** One active filter shown as a removable chip. */
export interface FilterChip {
  readonly name: (typeof CASE_LIST_FILTERS)[number];
  readonly label: string;
}

/** The query's active filters as chips, in a fixed order, each saying what it keeps. */
export function filterChips(query: CaseListQuery, operators: readonly OperatorView[], locale: string): FilterChip[] {
  const date = (value: string) => formatLocalDate(value, 'date', locale);
  const labels: Record<FilterChip['name'], string | null> = {
    patientCode: query.patientCode ? `Patient code contains “${query.patientCode}”` : null,
    operatorId:
      query.operatorId === undefined
        ? null
        : `Operator: ${operators.find((operator) => operator.id === query.operatorId)?.displayName ?? `#${query.operatorId}`}`,
    procedure: query.procedure ? `Procedure: ${PROCEDURE_LABELS[query.procedure]}` : null,
    status: query.status ? `Status: ${CASE_STATUS_LABELS[query.status]}` : null,
    phenotype: query.phenotype ? `Phenotype: ${PHENOTYPE_LABELS[query.phenotype]}` : null,
    tooth: query.tooth === undefined ? null : `Tooth ${query.tooth}`,
    from: query.from ? `Operated from ${date(query.from)}` : null,
    to: query.to ? `Operated until ${date(query.to)}` : null,
  };
  return CASE_LIST_FILTERS.flatMap((name) => {
    const label = labels[name];
    return label ? [{ name, label }] : [];
  });
}

import type { AuditDataset } from '@tidemark/shared';
import { letterFor } from '../services/operator-labels';

/**
 * Operators of a dataset as letters, assigned as the app assigns them for the governance view
 * (operator-labels.ts: letters follow the operators' ids), so "Operator B" in the workbook is
 * "Operator B" on the governance dashboards too. Null for an operator without cases in the dataset.
 */
export function operatorLetters(dataset: AuditDataset): (operatorId: number) => string | null {
  const ids = new Set<number>();
  for (const found of dataset.cases) ids.add(found.operatorId);
  for (const record of dataset.records) ids.add(record.operatorId);
  const letters = new Map([...ids].sort((a, b) => a - b).map((id, index) => [id, letterFor(index)]));
  return (operatorId) => letters.get(operatorId) ?? null;
}

import type { EntityManager } from 'typeorm';
import { ChangeRecord } from '../entities/change-record.entity';

/** One changed field: old and new values as they were stored. */
export interface FieldChange {
  field: string;
  oldValue: unknown;
  newValue: unknown;
}

/** Context of a change: what, whose case, who, why. */
export interface ChangeContext {
  entity: string;
  entityId: number;
  caseId: number | null;
  userId: number;
  reason: string | null;
}

function asText(value: unknown): string | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string') return value;
  return JSON.stringify(value);
}

/** The fields of `change` whose value differs from `current`. */
export function diffFields<T extends object>(current: T, change: Partial<T>): FieldChange[] {
  const changes: FieldChange[] = [];
  for (const [field, newValue] of Object.entries(change)) {
    if (newValue === undefined) continue;
    const oldValue: unknown = current[field as keyof T];
    const isSame = oldValue === newValue || (typeof oldValue === 'boolean' && Number(oldValue) === Number(newValue));
    if (!isSame) changes.push({ field, oldValue, newValue });
  }
  return changes;
}

/** The new values of a diff as a column → value map, for the UPDATE. */
export function changedValues(changes: readonly FieldChange[]): Record<string, unknown> {
  return Object.fromEntries(changes.map((entry) => [entry.field, entry.newValue]));
}

/** Appends change records in the caller's transaction, so history and change commit together. */
export async function appendChanges(manager: EntityManager, context: ChangeContext, changes: FieldChange[]): Promise<void> {
  if (changes.length === 0) return;
  const changedAt = new Date();
  await manager.getRepository(ChangeRecord).insert(
    changes.map((change) => ({
      entity: context.entity,
      entityId: context.entityId,
      caseId: context.caseId,
      field: change.field,
      oldValue: asText(change.oldValue),
      newValue: asText(change.newValue),
      changedById: context.userId,
      changedAt,
      reason: context.reason,
    })),
  );
}

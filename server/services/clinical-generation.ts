/**
 * The *clinical data generation*: what caches of clinical answers compare to know whether
 * anything they were computed from has changed (audit-results-cache.ts, case-list-cache.ts).
 *
 * **Rule.** Clinical rows are never deleted, every correction of one appends to the append-only
 * `change_record` (services/change-log.ts), and ids are never reused (AUTOINCREMENT in SQLite,
 * sequences in PostgreSQL). So the highest id of each table below changes with any clinical
 * write — through the API, the import or another process on the same database. Writes made
 * outside Tidemark's own code paths (hand-edited SQL that updates a clinical row without a change
 * record) are not seen: do not do that.
 */

/** Tables whose rows are only ever inserted, or updated with an entry in change_record (no deletes). */
export const CLINICAL_TABLES = ['patient', 'surgical_case', 'site', 'visit', 'site_measurement', 'complication', 'calibration_reading', 'change_record'] as const;

/**
 * The generation as a select list, one column per {@link CLINICAL_TABLES} entry
 * (`(SELECT MAX(t.id) FROM patient t) AS max_patient, …`; SQL both SQLite and PostgreSQL read),
 * for the caches' statements, which add what else their answers depend on.
 */
export const CLINICAL_GENERATION_SELECT_LIST = CLINICAL_TABLES.map((table) => `(SELECT MAX(t.id) FROM ${table} t) AS max_${table}`).join(', ');

/** A generation row as text, column by column in a fixed order, so equal generations give equal strings. */
export function generationText(row: Record<string, unknown>): string {
  return Object.keys(row)
    .sort()
    .map((column) => `${column}=${String(row[column] ?? '')}`)
    .join('|');
}

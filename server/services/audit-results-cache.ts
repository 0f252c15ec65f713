import type { DataSource } from 'typeorm';

/** Which computed results an entry holds: one audit, live or one cycle, one variant (e.g. the grouping). */
export interface ResultsCacheKey {
  auditId: number;
  cycleId: number | null;
  variant: string;
  /** The date the results are computed as of: a new day re-evaluates recall windows. */
  asOf: string;
}

/** Hits and misses since the app started (for tests and diagnostics). */
export interface ResultsCacheStats {
  hits: number;
  misses: number;
  /** Requests answered without the cache because the audit or cycle was not found (the computation reports the 404). */
  bypasses: number;
  size: number;
}

interface Entry<T> {
  generation: string;
  value: Promise<T>;
}

/** Tables whose rows are only ever inserted, or updated with an entry in change_record (no deletes). */
const CLINICAL_TABLES = ['patient', 'surgical_case', 'site', 'visit', 'site_measurement', 'complication', 'calibration_reading', 'change_record'] as const;

/**
 * Computed audit results, kept while nothing they are computed from has changed.
 *
 * **Invalidation rule.** Every request first reads the *data generation* in one query:
 *  - `MAX(id)` of each clinical table (patients, cases, sites, visits, measurements,
 *    complications, calibration readings) and of `change_record`. Clinical rows are never
 *    deleted and every correction of one appends to the append-only `change_record`, and ids
 *    are never reused (AUTOINCREMENT in SQLite, sequences in PostgreSQL), so any clinical write —
 *    through the API, the import or another process on the same database — raises one of them;
 *  - the audit's `version` (cohort, thresholds, schedule), its schedule's `version`;
 *  - its standards' count, highest id and sum of versions (edits bump a version, additions a
 *    new highest id, deletions the count; together they change whenever the set changes);
 *  - the cycle's `version` when results are for a cycle (period, state and freezing bump it);
 *  - and the as-of date.
 * An entry whose generation differs from the current one is recomputed and replaced. Anything
 * that depends on who is looking (operator names and letters) is not cached but applied per
 * request by the caller. Writes made outside Tidemark's own code paths (hand-edited SQL that
 * updates a clinical row without a change record) are not seen: do not do that.
 *
 * Concurrent misses for the same key and generation share one computation. At most `capacity`
 * entries are kept, least recently used first out.
 */
export class AuditResultsCache<T> {
  private readonly entries = new Map<string, Entry<T>>();
  private hits = 0;
  private misses = 0;
  private bypasses = 0;

  constructor(
    private readonly dataSource: DataSource,
    private readonly capacity = 64,
  ) {}

  /**
   * The cached value for `key` if the data generation is unchanged, else `compute()`'s (stored).
   * `compute` runs uncached when the audit or the cycle does not exist, so its own 404 stands.
   */
  async getOrCompute(key: ResultsCacheKey, compute: () => Promise<T>): Promise<T> {
    const generation = await this.generation(key);
    if (generation === null) {
      this.bypasses++;
      return compute();
    }
    const id = `${key.auditId}|${key.cycleId ?? 'live'}|${key.variant}`;
    const found = this.entries.get(id);
    if (found && found.generation === generation) {
      this.hits++;
      // Re-insert: Map keeps insertion order, so the first key is the least recently used.
      this.entries.delete(id);
      this.entries.set(id, found);
      return found.value;
    }
    this.misses++;
    // The generation was read before computing: if data change meanwhile, the next request sees a newer one.
    const value = compute();
    const entry: Entry<T> = { generation, value };
    this.entries.delete(id);
    this.entries.set(id, entry);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
    // A failed computation is not kept: the next request tries again.
    value.catch(() => {
      if (this.entries.get(id) === entry) this.entries.delete(id);
    });
    return value;
  }

  /** Counters since start. */
  stats(): ResultsCacheStats {
    return { hits: this.hits, misses: this.misses, bypasses: this.bypasses, size: this.entries.size };
  }

  /** The data generation for `key` (see the class comment), or null when the audit or cycle is missing. */
  private async generation(key: ResultsCacheKey): Promise<string | null> {
    const builder = this.dataSource
      .createQueryBuilder()
      .from('audit', 'a')
      .innerJoin('recall_schedule', 's', 's.id = a.schedule_id')
      .select('a.version', 'audit_version')
      .addSelect('s.version', 'schedule_version')
      .addSelect('(SELECT COUNT(*) FROM audit_standard x WHERE x.audit_id = a.id)', 'standard_count')
      .addSelect('(SELECT MAX(x.id) FROM audit_standard x WHERE x.audit_id = a.id)', 'standard_max_id')
      .addSelect('(SELECT SUM(x.version) FROM audit_standard x WHERE x.audit_id = a.id)', 'standard_versions')
      .addSelect('(SELECT c.version FROM audit_cycle c WHERE c.id = :cycleId AND c.audit_id = a.id)', 'cycle_version')
      .where('a.id = :auditId', { auditId: key.auditId, cycleId: key.cycleId ?? 0 });
    for (const table of CLINICAL_TABLES) builder.addSelect(`(SELECT MAX(t.id) FROM ${table} t)`, `max_${table}`);
    const row = await builder.getRawOne<Record<string, string | number | null>>();
    if (!row) return null;
    if (key.cycleId !== null && row.cycle_version === null) return null;
    const parts = [key.asOf, ...Object.keys(row).sort().map((column) => `${column}=${row[column] ?? ''}`)];
    return parts.join('|');
  }
}

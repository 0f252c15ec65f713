import type { DataSource } from 'typeorm';
import { portableSql } from '../portable-sql';
import { CLINICAL_GENERATION_SELECT_LIST, generationText } from './clinical-generation';
import { GenerationCache } from './generation-cache';

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

/**
 * The generation of one audit's results in one statement, parameters (cycle id, audit id) in that
 * order. Written out rather than built by TypeORM's query builder on every request, which cost
 * several times the query (measured under `npm run bench:api`).
 */
const GENERATION_SQL = [
  'SELECT a.version AS audit_version, s.version AS schedule_version,',
  '(SELECT COUNT(*) FROM audit_standard x WHERE x.audit_id = a.id) AS standard_count,',
  '(SELECT MAX(x.id) FROM audit_standard x WHERE x.audit_id = a.id) AS standard_max_id,',
  '(SELECT SUM(x.version) FROM audit_standard x WHERE x.audit_id = a.id) AS standard_versions,',
  '(SELECT c.version FROM audit_cycle c WHERE c.id = ? AND c.audit_id = a.id) AS cycle_version,',
  CLINICAL_GENERATION_SELECT_LIST,
  'FROM audit a INNER JOIN recall_schedule s ON s.id = a.schedule_id WHERE a.id = ?',
].join(' ');

/**
 * Computed audit results, kept while nothing they are computed from has changed.
 *
 * **Invalidation rule.** Every request first reads the *data generation* in one query:
 *  - the clinical data generation (clinical-generation.ts, where the rule is argued): `MAX(id)`
 *    of each clinical table (patients, cases, sites, visits, measurements, complications,
 *    calibration readings) and of the append-only `change_record`, which any clinical write —
 *    through the API, the import or another process on the same database — raises;
 *  - the audit's `version` (cohort, thresholds, schedule), its schedule's `version`;
 *  - its standards' count, highest id and sum of versions (edits bump a version, additions a
 *    new highest id, deletions the count; together they change whenever the set changes);
 *  - the cycle's `version` when results are for a cycle (period, state and freezing bump it);
 *  - and the as-of date.
 * An entry whose generation differs from the current one is recomputed and replaced. Anything
 * that depends on who is looking (operator names and letters) is not cached but applied per
 * request by the caller.
 *
 * Entries live in a {@link GenerationCache}: concurrent misses for the same key and generation
 * share one computation; at most `capacity` entries, least recently used first out.
 */
export class AuditResultsCache<T> {
  private readonly entries: GenerationCache<T>;
  private readonly generationSql: string;
  private bypasses = 0;

  constructor(
    private readonly dataSource: DataSource,
    capacity = 64,
  ) {
    this.entries = new GenerationCache<T>(capacity);
    this.generationSql = portableSql(dataSource, GENERATION_SQL);
  }

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
    return this.entries.getOrCompute(`${key.auditId}|${key.cycleId ?? 'live'}|${key.variant}`, generation, compute);
  }

  /** Counters since start. */
  stats(): ResultsCacheStats {
    return { ...this.entries.stats(), bypasses: this.bypasses };
  }

  /** The data generation for `key` (see the class comment), or null when the audit or cycle is missing. */
  private async generation(key: ResultsCacheKey): Promise<string | null> {
    const [row] = await this.dataSource.query<Array<Record<string, string | number | null>>>(this.generationSql, [key.cycleId ?? 0, key.auditId]);
    if (!row) return null;
    if (key.cycleId !== null && row.cycle_version === null) return null;
    return `${key.asOf}|${generationText(row)}`;
  }
}

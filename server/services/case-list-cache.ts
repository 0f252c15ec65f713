import type { DataSource } from 'typeorm';
import { caseListQuerySchema, type CaseListQuery } from '@tidemark/shared';
import { CLINICAL_GENERATION_SELECT_LIST, generationText } from './clinical-generation';
import { GenerationCache, type GenerationCacheStats } from './generation-cache';

/** The query's fields in the schema's order, so that equal queries give equal keys whatever order they came in. */
const QUERY_FIELDS = Object.keys(caseListQuerySchema.shape);

/**
 * The generation in one statement: every account's id and display name (the list shows operators
 * by name and sorts by it, and names can be changed), each row also carrying the clinical data
 * generation. Those subqueries are uncorrelated, so both databases evaluate them once (SQLite
 * caches a constant subquery, PostgreSQL runs it as an InitPlan), not once per account.
 */
const GENERATION_SQL = `SELECT id, display_name, ${CLINICAL_GENERATION_SELECT_LIST} FROM "user" ORDER BY id`;

/** How many pages (viewer scope × query) are kept; a page of 200 cases is about 60 kB of JSON. */
const CAPACITY = 128;

/**
 * Case list pages, kept serialised (the JSON bytes the route sends) while nothing they show has
 * changed: `GET /api/cases` is the busiest clinical read.
 *
 * **Invalidation rule.** Every request first reads the generation, in one short statement: the
 * clinical data generation (clinical-generation.ts — patients, cases, sites and visits are all
 * covered: a new row raises a table's highest id, a correction appends a change record) and every
 * account's id and display name (operator names are shown and sorted by; the user table has no
 * history, so the names themselves are compared). A page whose generation differs is recomputed.
 *
 * **Scope.** Entries are keyed by the viewer's scope as well as the query: a clinician's own
 * cases (`operator:<id>`) or every case (`all`, for the roles that read all), exactly as the list
 * query narrows them (CaseService.list). Whether the role may list cases at all is checked before
 * the cache is asked.
 */
export class CaseListCache {
  private readonly pages = new GenerationCache<Buffer>(CAPACITY);

  constructor(private readonly dataSource: DataSource) {}

  /**
   * The page for `scope` and `query` as JSON bytes: from the cache while the generation is
   * unchanged, else `compute()`'s page, serialised and stored.
   *
   * @param scope the viewer's scope, `operator:<id>` or `all` (see the class comment)
   */
  async getOrCompute(scope: string, query: CaseListQuery, compute: () => Promise<unknown>): Promise<Buffer> {
    const serialised = async (): Promise<Buffer> => Buffer.from(JSON.stringify(await compute()), 'utf8');
    const generation = await this.generation();
    // No account at all (nobody could be signed in): nothing to compare against, so no caching.
    if (generation === null) return serialised();
    return this.pages.getOrCompute(`${scope}|${JSON.stringify(query, QUERY_FIELDS)}`, generation, serialised);
  }

  /** Hits and misses since start. */
  stats(): GenerationCacheStats {
    return this.pages.stats();
  }

  private async generation(): Promise<string | null> {
    const rows = await this.dataSource.query<Array<Record<string, unknown> & { id: number; display_name: string }>>(GENERATION_SQL);
    if (rows.length === 0) return null;
    const { id: _id, display_name: _name, ...clinical } = rows[0];
    // JSON keeps names apart whatever characters they hold.
    return `${generationText(clinical)}|names=${JSON.stringify(rows.map((row) => [Number(row.id), row.display_name]))}`;
  }
}

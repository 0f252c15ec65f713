import type { ParamMap, Params } from '@angular/router';
import { caseListQuerySchema, type CaseListQuery } from '@tidemark/shared';
import type { ZodType } from 'zod';

/** The list's starting point: what an address without query parameters means. */
export const DEFAULT_CASE_LIST_QUERY: CaseListQuery = caseListQuerySchema.parse({});

/** Page sizes offered under the table. */
export const CASE_PAGE_SIZES = [10, 25, 50, 100] as const;

/** The filter part of the query (no paging or sorting). */
export type CaseListFilters = Omit<CaseListQuery, 'page' | 'pageSize' | 'sort' | 'direction'>;

/** Names of the filters, in the order they appear as chips. */
export const CASE_LIST_FILTERS = ['patientCode', 'operatorId', 'procedure', 'status', 'phenotype', 'tooth', 'from', 'to'] as const;

/**
 * Reads the list's state from the address. Each parameter is checked on its own with the
 * server's schema, so one bad or stale value (a typo in a shared link) drops only itself.
 */
export function readCaseListQuery(params: ParamMap): CaseListQuery {
  const shape = caseListQuerySchema.shape;
  const text = (name: string) => params.get(name) ?? undefined;
  const patientCode = pick(shape.patientCode, text('patientCode'), undefined);
  return {
    page: pick(shape.page, text('page'), DEFAULT_CASE_LIST_QUERY.page),
    pageSize: pick(shape.pageSize, text('pageSize'), DEFAULT_CASE_LIST_QUERY.pageSize),
    sort: pick(shape.sort, text('sort'), DEFAULT_CASE_LIST_QUERY.sort),
    direction: pick(shape.direction, text('direction'), DEFAULT_CASE_LIST_QUERY.direction),
    operatorId: pick(shape.operatorId, text('operatorId'), undefined),
    procedure: pick(shape.procedure, text('procedure'), undefined),
    status: pick(shape.status, text('status'), undefined),
    phenotype: pick(shape.phenotype, text('phenotype'), undefined),
    from: pick(shape.from, text('from'), undefined),
    to: pick(shape.to, text('to'), undefined),
    tooth: pick(shape.tooth, text('tooth'), undefined),
    patientCode: patientCode ? patientCode : undefined,
  };
}

/**
 * Writes the state back as query parameters, leaving out defaults and empty filters so
 * shared links stay short and a plain `/cases` means "everything, newest first".
 */
export function caseListQueryParams(query: CaseListQuery): Params {
  const params: Params = {};
  if (query.page !== DEFAULT_CASE_LIST_QUERY.page) params['page'] = query.page;
  if (query.pageSize !== DEFAULT_CASE_LIST_QUERY.pageSize) params['pageSize'] = query.pageSize;
  if (query.sort !== DEFAULT_CASE_LIST_QUERY.sort) params['sort'] = query.sort;
  if (query.direction !== DEFAULT_CASE_LIST_QUERY.direction) params['direction'] = query.direction;
  for (const name of CASE_LIST_FILTERS) {
    const value = query[name];
    if (value !== undefined && value !== '') params[name] = value;
  }
  return params;
}

/** True when both queries ask the server for the same page. */
export function isSameCaseListQuery(a: CaseListQuery, b: CaseListQuery): boolean {
  const left = caseListQueryParams(a);
  const right = caseListQueryParams(b);
  const keys = new Set([...Object.keys(left), ...Object.keys(right)]);
  return [...keys].every((key) => String(left[key]) === String(right[key]));
}

/** The schema's value for `raw`, or `fallback` when it does not pass. */
function pick<T>(schema: ZodType<T>, raw: string | undefined, fallback: T): T {
  const result = schema.safeParse(raw);
  return result.success ? result.data : fallback;
}

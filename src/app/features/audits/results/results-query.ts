import type { ParamMap, Params } from '@angular/router';
import { GROUP_BY_OPTIONS, PHENOTYPES, type GroupBy, type Phenotype, type RecallInterval } from '@tidemark/shared';
import type { FunnelMeasure } from './results-api';

/** The Results area's view as kept in the address, so a partner can share exactly what they see. */
export interface ResultsQuery {
  /** Subgroup dimension, or null for the whole cohort. */
  readonly groupBy: GroupBy | null;
  /** Interval key as written in the address; checked against the schedule once it is known. */
  readonly interval: string | null;
  readonly measure: FunnelMeasure;
  /** Cycle id, or null for live results. */
  readonly cycle: number | null;
  /** Only cases of this gingival phenotype, or null for every phenotype. */
  readonly phenotype: Phenotype | null;
  /** Only cases of this operator (user id), or null for every operator. */
  readonly operator: number | null;
}

/** Names of the query parameters the Results area owns; every other parameter (e.g. `area`) is left alone. */
export const RESULTS_QUERY_PARAMS = ['groupBy', 'interval', 'measure', 'cycle', 'phenotype', 'operator'] as const;

/** What an address without any of our parameters means. */
export const DEFAULT_RESULTS_QUERY: ResultsQuery = { groupBy: null, interval: null, measure: 'complication', cycle: null, phenotype: null, operator: null };

/** Same limits as the server's interval key (`max(20)`), so a typo in a link never reaches the API. */
const INTERVAL_KEY = /^[A-Za-z0-9_-]{1,20}$/;

/** Reads the view from the address; a bad or stale value drops only itself. */
export function readResultsQuery(params: ParamMap): ResultsQuery {
  const groupBy = params.get('groupBy');
  const interval = params.get('interval');
  const measure = params.get('measure');
  const phenotype = params.get('phenotype');
  return {
    groupBy: GROUP_BY_OPTIONS.find((option) => option === groupBy) ?? null,
    interval: interval !== null && INTERVAL_KEY.test(interval) ? interval : null,
    measure: measure === 'relapse' ? 'relapse' : 'complication',
    cycle: positiveWhole(params.get('cycle')),
    phenotype: PHENOTYPES.find((option) => option === phenotype) ?? null,
    operator: positiveWhole(params.get('operator')),
  };
}

/**
 * Query parameters for a change of view, for `queryParamsHandling: 'merge'`: a default
 * becomes null, which removes the parameter and keeps shared links short.
 */
export function resultsQueryParams(change: Partial<ResultsQuery>): Params {
  const params: Params = {};
  if ('groupBy' in change) params['groupBy'] = change.groupBy ?? null;
  if ('interval' in change) params['interval'] = change.interval ?? null;
  if ('measure' in change) params['measure'] = change.measure === 'relapse' ? 'relapse' : null;
  if ('cycle' in change) params['cycle'] = change.cycle ?? null;
  if ('phenotype' in change) params['phenotype'] = change.phenotype ?? null;
  if ('operator' in change) params['operator'] = change.operator ?? null;
  return params;
}

/** A positive whole number written in the address, else null. */
function positiveWhole(text: string | null): number | null {
  const value = Number(text ?? Number.NaN);
  return Number.isInteger(value) && value > 0 ? value : null;
}

/** True when both ask for the same view. */
export function isSameResultsQuery(a: ResultsQuery, b: ResultsQuery): boolean {
  return RESULTS_QUERY_PARAMS.every((name) => a[name] === b[name]);
}

/**
 * The interval to show: the one asked for when the schedule has it, else the server's
 * default (6 months when scheduled, otherwise the last interval). Null without a schedule.
 */
export function resolveInterval(requested: string | null, schedule: readonly RecallInterval[]): string | null {
  if (requested !== null && schedule.some((interval) => interval.key === requested)) return requested;
  return schedule.find((interval) => interval.key === '6m')?.key ?? schedule.at(-1)?.key ?? null;
}

import type { ParamMap, Params } from '@angular/router';
import { GROUP_BY_OPTIONS, type GroupBy, type RecallInterval } from '@tidemark/shared';
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
}

/** Names of the query parameters the Results area owns; every other parameter (e.g. `area`) is left alone. */
export const RESULTS_QUERY_PARAMS = ['groupBy', 'interval', 'measure', 'cycle'] as const;

/** What an address without any of our parameters means. */
export const DEFAULT_RESULTS_QUERY: ResultsQuery = { groupBy: null, interval: null, measure: 'complication', cycle: null };

/** Same limits as the server's interval key (`max(20)`), so a typo in a link never reaches the API. */
const INTERVAL_KEY = /^[A-Za-z0-9_-]{1,20}$/;

/** Reads the view from the address; a bad or stale value drops only itself. */
export function readResultsQuery(params: ParamMap): ResultsQuery {
  const groupBy = params.get('groupBy');
  const interval = params.get('interval');
  const measure = params.get('measure');
  const cycle = Number(params.get('cycle') ?? Number.NaN);
  return {
    groupBy: GROUP_BY_OPTIONS.find((option) => option === groupBy) ?? null,
    interval: interval !== null && INTERVAL_KEY.test(interval) ? interval : null,
    measure: measure === 'relapse' ? 'relapse' : 'complication',
    cycle: Number.isInteger(cycle) && cycle > 0 ? cycle : null,
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
  return params;
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

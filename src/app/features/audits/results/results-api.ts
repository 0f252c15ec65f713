import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditResults, CalibrationResult, FunnelResult, GroupBy, Phenotype, SurvivalResult, TrendResult } from '@tidemark/shared';
import { Observable } from 'rxjs';

/** Which funnel the operators are placed on. */
export type FunnelMeasure = FunnelResult['measure'];

/**
 * Live results (no cycle) or one audit cycle's (frozen once reported), optionally narrowed to
 * one gingival phenotype and/or one operator (left out: the whole cohort).
 */
export interface ResultsScope {
  /** The cycle, or null for live results. */
  readonly cycleId: number | null;
  /** Only cases of this phenotype. */
  readonly phenotype?: Phenotype | null;
  /** Only cases of this operator (user id). The funnel never takes it: it compares every operator. */
  readonly operatorId?: number | null;
}

/** HTTP calls of the Results area of an audit (server routes in `server/routes/audits.routes.ts`). */
@Injectable({ providedIn: 'root' })
export class ResultsApi {
  private readonly http = inject(HttpClient);

  /** Every summary of the audit, optionally split into subgroups whose labels the server has already de-identified. */
  results(auditId: number, scope: ResultsScope & { readonly groupBy: GroupBy | null }): Observable<AuditResults> {
    return this.http.get<AuditResults>(this.address(auditId, 'results'), { params: scopeParams(scope, { groupBy: scope.groupBy }) });
  }

  /** Operators' complication or relapse rates against the practice rate, with 95% and 99.8% limits. */
  funnel(auditId: number, scope: Omit<ResultsScope, 'operatorId'> & { readonly measure: FunnelMeasure; readonly intervalKey: string | null }): Observable<FunnelResult> {
    const params = scopeParams(scope, { measure: scope.measure, intervalKey: scope.intervalKey });
    return this.http.get<FunnelResult>(this.address(auditId, 'funnel'), { params });
  }

  /** Monthly control charts (relapse share, mean rebound) and the complication CUSUM. */
  trend(auditId: number, scope: ResultsScope & { readonly intervalKey: string | null }): Observable<TrendResult> {
    return this.http.get<TrendResult>(this.address(auditId, 'trend'), { params: scopeParams(scope, { intervalKey: scope.intervalKey }) });
  }

  /** Time to relapse (Kaplan–Meier), censored at each site's last recall. */
  survival(auditId: number, scope: ResultsScope): Observable<SurvivalResult> {
    return this.http.get<SurvivalResult>(this.address(auditId, 'survival'), { params: scopeParams(scope, {}) });
  }

  /** Agreement of repeated REF→GM readings between examiners. */
  calibration(auditId: number, scope: ResultsScope): Observable<CalibrationResult> {
    return this.http.get<CalibrationResult>(this.address(auditId, 'calibration'), { params: scopeParams(scope, {}) });
  }

  private address(auditId: number, view: string): string {
    return `/api/audits/${encodeURIComponent(auditId)}/${view}`;
  }
}

/** Query parameters for a scope plus extra filters; nulls are left out so the server applies its defaults. */
function scopeParams(scope: ResultsScope, extra: Readonly<Record<string, string | null>>): HttpParams {
  let params = new HttpParams();
  if (scope.cycleId !== null) params = params.set('cycleId', scope.cycleId);
  if (scope.phenotype) params = params.set('phenotype', scope.phenotype);
  if (scope.operatorId) params = params.set('operatorId', scope.operatorId);
  for (const [name, value] of Object.entries(extra)) {
    if (value !== null) params = params.set(name, value);
  }
  return params;
}

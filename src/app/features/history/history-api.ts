import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ChangeRecordView } from '@tidemark/shared';
import { Observable } from 'rxjs';

/** One page of the change history. */
export interface ChangeHistoryPage {
  items: ChangeRecordView[];
  total: number;
}

/** Which page of the history to fetch, optionally for one case. */
export interface ChangeHistoryQuery {
  readonly page: number;
  readonly pageSize: number;
  readonly caseId?: number;
}

/** HTTP calls of the Change history page. */
@Injectable({ providedIn: 'root' })
export class HistoryApi {
  private readonly http = inject(HttpClient);

  /** Change records, newest first, paged on the server (clinicians: their own cases only). */
  list(query: ChangeHistoryQuery): Observable<ChangeHistoryPage> {
    let params = new HttpParams().set('page', query.page).set('pageSize', query.pageSize);
    if (query.caseId !== undefined) {
      params = params.set('caseId', query.caseId);
    }
    return this.http.get<ChangeHistoryPage>('/api/history', { params });
  }
}

import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { RecallDueList } from '@tidemark/shared';
import { Observable } from 'rxjs';

/** HTTP calls of the Today page. */
@Injectable({ providedIn: 'root' })
export class TodayApi {
  private readonly http = inject(HttpClient);

  /**
   * Recalls in their window, overdue and coming up, as of `asOf` (YYYY-MM-DD; the
   * server's today when left out). Clinicians get their own cases, the audit lead everyone's.
   */
  due(asOf?: string): Observable<RecallDueList> {
    const params = asOf ? new HttpParams().set('asOf', asOf) : undefined;
    return this.http.get<RecallDueList>('/api/recalls/due', { params });
  }
}

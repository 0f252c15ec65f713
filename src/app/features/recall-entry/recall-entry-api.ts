import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CaseDetail, VisitCreateRequest, VisitUpdateRequest } from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** HTTP calls of the Recall entry page. */
@Injectable({ providedIn: 'root' })
export class RecallEntryApi {
  private readonly http = inject(HttpClient);

  /** The whole case: sites, visits with their measurements and versions. */
  getCase(caseId: number): Observable<CaseDetail> {
    return this.http.get<CaseDetail>(`/api/cases/${encodeURIComponent(caseId)}`);
  }

  /**
   * Records a recall. The page shows field errors, the large-change confirmation and
   * conflicts itself, so the global notice stays out of it.
   */
  recordVisit(caseId: number, visit: VisitCreateRequest): Observable<CaseDetail> {
    return this.http.post<CaseDetail>(`/api/cases/${encodeURIComponent(caseId)}/visits`, visit, { context: showsOwnErrors() });
  }

  /** Corrects a recorded recall (version and reason required); a 409 means someone saved first. */
  correctVisit(visitId: number, correction: VisitUpdateRequest): Observable<CaseDetail> {
    return this.http.patch<CaseDetail>(`/api/visits/${encodeURIComponent(visitId)}`, correction, { context: showsOwnErrors() });
  }
}

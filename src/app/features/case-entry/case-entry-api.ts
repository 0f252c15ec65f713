import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CaseCreateRequest, CaseDetail, OperatorView, PatientView } from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** HTTP calls of the New case page. */
@Injectable({ providedIn: 'root' })
export class CaseEntryApi {
  private readonly http = inject(HttpClient);

  /** Active clinicians and audit leads, for the operator choice. */
  operators(): Observable<OperatorView[]> {
    return this.http.get<OperatorView[]>('/api/operators');
  }

  /** Patients whose code contains `code` (at most 50, the ones this user may see). */
  findPatients(code: string): Observable<PatientView[]> {
    return this.http.get<PatientView[]>('/api/patients', { params: new HttpParams().set('code', code.trim()) });
  }

  /**
   * Registers a case with its sites (and a new patient when one is given). The form shows
   * field errors and a taken patient code itself, so the global notice stays out of it.
   */
  createCase(body: CaseCreateRequest): Observable<CaseDetail> {
    return this.http.post<CaseDetail>('/api/cases', body, { context: showsOwnErrors() });
  }
}

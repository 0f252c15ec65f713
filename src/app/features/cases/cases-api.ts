import { HttpClient, HttpEvent, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  CaseDetail,
  CaseListPage,
  CaseListQuery,
  CaseUpdateRequest,
  ComplicationCreateRequest,
  ComplicationUpdateRequest,
  ComplicationView,
  OperatorView,
  PhotoKind,
  PhotoView,
} from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** What goes with a photograph upload besides the file. */
export interface PhotoUpload {
  readonly file: Blob;
  /** File name sent with the part; the server checks content, not the name. */
  readonly fileName: string;
  readonly kind: PhotoKind;
  readonly visitId?: number | null;
  /** YYYY-MM; the server uses the current month when left out. */
  readonly monthTaken?: string | null;
}

/** HTTP calls of the Cases feature: the case list, the case page and what hangs off a case. */
@Injectable({ providedIn: 'root' })
export class CasesApi {
  private readonly http = inject(HttpClient);

  /** One page of cases, sorted and filtered on the server. Empty filters are left out of the URL. */
  list(query: CaseListQuery): Observable<CaseListPage> {
    let params = new HttpParams()
      .set('page', query.page)
      .set('pageSize', query.pageSize)
      .set('sort', query.sort)
      .set('direction', query.direction);
    const filters = {
      operatorId: query.operatorId,
      procedure: query.procedure,
      status: query.status,
      phenotype: query.phenotype,
      from: query.from,
      to: query.to,
      tooth: query.tooth,
      patientCode: query.patientCode,
    };
    for (const [name, value] of Object.entries(filters)) {
      if (value !== undefined && value !== '') {
        params = params.set(name, value);
      }
    }
    return this.http.get<CaseListPage>('/api/cases', { params });
  }

  /**
   * The whole case. The case page explains a missing case itself ("not found, or not one
   * of yours"), so the global notice stays quiet.
   */
  get(id: number): Observable<CaseDetail> {
    return this.http.get<CaseDetail>(`/api/cases/${encodeURIComponent(id)}`, { context: showsOwnErrors() });
  }

  /** Changes case fields or moves its status; sends the version the person saw (409 if stale). */
  update(id: number, changes: CaseUpdateRequest): Observable<CaseDetail> {
    return this.http.patch<CaseDetail>(`/api/cases/${encodeURIComponent(id)}`, changes, { context: showsOwnErrors() });
  }

  /** Everyone who may operate, for the operator filter. */
  operators(): Observable<OperatorView[]> {
    return this.http.get<OperatorView[]>('/api/operators');
  }

  /** Records a complication; the dialog shows field errors itself. */
  addComplication(caseId: number, complication: ComplicationCreateRequest): Observable<ComplicationView> {
    return this.http.post<ComplicationView>(`/api/cases/${encodeURIComponent(caseId)}/complications`, complication, {
      context: showsOwnErrors(),
    });
  }

  /** Corrects a complication (e.g. its resolution), with version and reason. */
  updateComplication(id: number, changes: ComplicationUpdateRequest): Observable<ComplicationView> {
    return this.http.patch<ComplicationView>(`/api/complications/${encodeURIComponent(id)}`, changes, {
      context: showsOwnErrors(),
    });
  }

  /**
   * Uploads a photograph as multipart form data, reporting progress events so the
   * page can show a determinate bar. 413 and 415 carry the server's own sentence.
   */
  uploadPhoto(caseId: number, upload: PhotoUpload): Observable<HttpEvent<PhotoView>> {
    const body = new FormData();
    body.append('kind', upload.kind);
    if (upload.visitId) {
      body.append('visitId', String(upload.visitId));
    }
    if (upload.monthTaken) {
      body.append('monthTaken', upload.monthTaken);
    }
    // The file goes last so the fields are parsed before the (possibly large) file part.
    body.append('file', upload.file, upload.fileName);
    return this.http.post<PhotoView>(`/api/cases/${encodeURIComponent(caseId)}/photos`, body, {
      reportProgress: true,
      observe: 'events',
      context: showsOwnErrors(),
    });
  }
}

/** Address of a photograph's thumbnail (same origin, sent with the session cookie). */
export function photoThumbnailUrl(photoId: number): string {
  return `/api/photos/${encodeURIComponent(photoId)}/thumbnail`;
}

/** Address of the full photograph. */
export function photoUrl(photoId: number): string {
  return `/api/photos/${encodeURIComponent(photoId)}`;
}

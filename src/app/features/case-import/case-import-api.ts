import { HttpClient, HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** Largest file the server takes (`POST /api/imports`). */
export const IMPORT_MAX_BYTES = 10 * 1024 * 1024;

/** Where an import job stands: rows checked first, then stored in one go. */
export type ImportJobState = 'validating' | 'importing' | 'done' | 'failed' | 'rejected';

/** One problem in the file: a spreadsheet row number, the column, and what is wrong. */
export interface ImportRowError {
  readonly row: number;
  readonly column: string;
  readonly message: string;
}

/** What an import stored (all zero until it is done). */
export interface ImportCounts {
  readonly patients: number;
  readonly cases: number;
  readonly sites: number;
  readonly visits: number;
}

/** `GET /api/imports/:jobId`. */
export interface ImportJob {
  readonly state: ImportJobState;
  /** Share done, 0–1. */
  readonly progress: number;
  readonly counts: ImportCounts;
  readonly errors: readonly ImportRowError[];
  /** The server's sentence when the job failed for a reason other than its rows. */
  readonly error?: string | null;
}

/** A server job's id, as the server hands it out. */
export type ImportJobId = string | number;

/** `POST /api/imports` → 202. */
export interface ImportStarted {
  readonly jobId: ImportJobId;
}

/** Template formats the server offers. */
export type TemplateFormat = 'xlsx' | 'csv';

/** Whether an import job has ended, either way. */
export function isImportFinished(job: ImportJob): boolean {
  return job.state === 'done' || job.state === 'failed' || job.state === 'rejected';
}

/** Address of the empty template with the exact column headers. */
export function importTemplateUrl(format: TemplateFormat): string {
  return `/api/imports/template.${format}`;
}

/** Address of a rejected import's row errors as CSV. */
export function importErrorReportUrl(jobId: ImportJobId): string {
  return `/api/imports/${encodeURIComponent(jobId)}/errors.csv`;
}

/**
 * HTTP calls of the import page (audit lead only). The page explains every failure beside the
 * upload, so these calls keep the global error notice quiet.
 */
@Injectable({ providedIn: 'root' })
export class CaseImportApi {
  private readonly http = inject(HttpClient);

  /** Sends the file as multipart field `file`, reporting upload progress. */
  upload(file: File): Observable<HttpEvent<ImportStarted>> {
    const body = new FormData();
    body.append('file', file, file.name);
    return this.http.post<ImportStarted>('/api/imports', body, { reportProgress: true, observe: 'events', context: showsOwnErrors() });
  }

  /** Where the import job stands, with its row errors once rejected. */
  status(jobId: ImportJobId): Observable<ImportJob> {
    return this.http.get<ImportJob>(`/api/imports/${encodeURIComponent(jobId)}`, { context: showsOwnErrors() });
  }
}

import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditView } from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** Where a workbook export job stands (`GET /api/exports/:jobId`). */
export type ExportJobState = 'running' | 'done' | 'failed';

/** A governance workbook being built on the server. */
export interface ExportJob {
  readonly state: ExportJobState;
  /** Share done, 0–1. */
  readonly progress: number;
  /** Data rows written so far. */
  readonly rows: number;
  /** The server's sentence when the job failed. */
  readonly error?: string | null;
  /** The workbook's file name, when the server names it in the status. */
  readonly fileName?: string | null;
}

/** A server job's id, as the server hands it out (opaque to the client). */
export type JobId = string | number;

/** `POST /api/audits/:id/exports` → 202. */
export interface ExportStarted {
  readonly jobId: JobId;
}

/** `POST /api/audits/:id/send-pack` → 202: how many committee members were written to. */
export interface PackNoticeSent {
  readonly queued: number;
}

const id = (value: JobId): string => encodeURIComponent(value);

/** Whether an export job has ended, well or badly. */
export function isExportFinished(job: ExportJob): boolean {
  return job.state !== 'running';
}

/** Address of a finished workbook (same origin: the session cookie goes with it). */
export function exportFileUrl(jobId: JobId): string {
  return `/api/exports/${id(jobId)}/file`;
}

/**
 * HTTP calls of the Reports page: audits to choose from, the governance workbook export and
 * the committee notice. The page explains export and notice failures beside the button, so
 * those calls keep the global error notice quiet.
 */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  /** Every audit the person may report on, with its cycles. */
  audits(): Observable<AuditView[]> {
    return this.http.get<AuditView[]>('/api/audits');
  }

  /** Starts building the workbook for live results (`cycleId` null) or one cycle. */
  startExport(auditId: number, cycleId: number | null): Observable<ExportStarted> {
    return this.http.post<ExportStarted>(`/api/audits/${id(auditId)}/exports`, { cycleId }, { context: showsOwnErrors() });
  }

  /** Where the export job stands. */
  exportStatus(jobId: JobId): Observable<ExportJob> {
    return this.http.get<ExportJob>(`/api/exports/${id(jobId)}`, { context: showsOwnErrors() });
  }

  /** Tells the governance committee the pack is ready (audit lead only): a sign-in link, no patient data. */
  sendPack(auditId: number, cycleId: number | null): Observable<PackNoticeSent> {
    return this.http.post<PackNoticeSent>(`/api/audits/${id(auditId)}/send-pack`, { cycleId }, { context: showsOwnErrors() });
  }
}

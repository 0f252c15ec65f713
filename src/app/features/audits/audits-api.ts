import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  ActionItemCreateRequest,
  ActionItemUpdateRequest,
  ActionItemView,
  AuditCreateRequest,
  AuditResults,
  AuditUpdateRequest,
  AuditView,
  CohortDefinitionInput,
  CohortPreview,
  CycleComparison,
  CycleCreateRequest,
  CycleUpdateRequest,
  CycleView,
  OperatorView,
  ReviewNoteCreateRequest,
  ReviewNoteView,
  ScheduleCreateRequest,
  ScheduleView,
  StandardCreateRequest,
  StandardUpdateRequest,
  StandardView,
} from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

const id = (value: number): string => encodeURIComponent(value);

/**
 * HTTP calls of the Audits feature: audits, their standards, cycles, action plans and
 * review notes. Writes show their own errors (field messages, "someone else changed it"),
 * so the global notice stays quiet for them; reads leave failures to the notice.
 */
@Injectable({ providedIn: 'root' })
export class AuditsApi {
  private readonly http = inject(HttpClient);

  /** Every audit with its standards and cycles. */
  list(): Observable<AuditView[]> {
    return this.http.get<AuditView[]>('/api/audits');
  }

  /** One audit; the page explains a missing audit itself. */
  get(auditId: number): Observable<AuditView> {
    return this.http.get<AuditView>(`/api/audits/${id(auditId)}`, { context: showsOwnErrors() });
  }

  /** Defines a new audit (audit lead). */
  create(audit: AuditCreateRequest): Observable<AuditView> {
    return this.http.post<AuditView>('/api/audits', audit, { context: showsOwnErrors() });
  }

  /** Changes an audit's scope with the version it was read at (409 when stale). */
  update(auditId: number, changes: AuditUpdateRequest): Observable<AuditView> {
    return this.http.patch<AuditView>(`/api/audits/${id(auditId)}`, changes, { context: showsOwnErrors() });
  }

  /** Removes an audit; refused (409) once a cycle was reported. */
  remove(auditId: number): Observable<void> {
    return this.http.delete<void>(`/api/audits/${id(auditId)}`, { context: showsOwnErrors() });
  }

  /** How many cases, patients and sites a cohort definition takes in, while it is edited. */
  previewCohort(cohort: CohortDefinitionInput): Observable<CohortPreview> {
    // The count is a courtesy beside the form: a failure shows as "count unavailable", not a notice.
    return this.http.post<CohortPreview>('/api/audits/cohort-preview', { cohort }, { context: showsOwnErrors() });
  }

  /** Recall schedules an audit can follow. */
  schedules(): Observable<ScheduleView[]> {
    return this.http.get<ScheduleView[]>('/api/schedules');
  }

  /** Adds a recall schedule (audit lead); the scope form then offers it. */
  createSchedule(schedule: ScheduleCreateRequest): Observable<ScheduleView> {
    return this.http.post<ScheduleView>('/api/schedules', schedule, { context: showsOwnErrors() });
  }

    /** Clinicians and audit leads, for cohort filters and action owners. */
  operators(): Observable<OperatorView[]> {
    return this.http.get<OperatorView[]>('/api/operators');
  }

  /** Adds a standard (criterion with target, evidence and exceptions). */
  addStandard(auditId: number, standard: StandardCreateRequest): Observable<StandardView> {
    return this.http.post<StandardView>(`/api/audits/${id(auditId)}/standards`, standard, { context: showsOwnErrors() });
  }

  /** Replaces a standard: its parameters depend on each other, so the whole standard goes with its version. */
  updateStandard(standardId: number, standard: StandardUpdateRequest): Observable<StandardView> {
    return this.http.patch<StandardView>(`/api/standards/${id(standardId)}`, standard, { context: showsOwnErrors() });
  }

  /** Removes a standard; reported cycles keep it in their frozen results. */
  removeStandard(standardId: number): Observable<void> {
    return this.http.delete<void>(`/api/standards/${id(standardId)}`, { context: showsOwnErrors() });
  }

  /** Opens a new cycle (first audit or re-audit) over a period of surgery dates. */
  addCycle(auditId: number, cycle: CycleCreateRequest): Observable<CycleView> {
    return this.http.post<CycleView>(`/api/audits/${id(auditId)}/cycles`, cycle, { context: showsOwnErrors() });
  }

  /** Moves a cycle's stage or changes its dates and notes; moving to `reported` freezes its results. */
  updateCycle(cycleId: number, changes: CycleUpdateRequest): Observable<CycleView> {
    return this.http.patch<CycleView>(`/api/cycles/${id(cycleId)}`, changes, { context: showsOwnErrors() });
  }

  /** Removes a cycle and its plan; refused (409) once reported. */
  removeCycle(cycleId: number): Observable<void> {
    return this.http.delete<void>(`/api/cycles/${id(cycleId)}`, { context: showsOwnErrors() });
  }

  /** Adds an action to a cycle's plan. */
  addAction(cycleId: number, action: ActionItemCreateRequest): Observable<ActionItemView> {
    return this.http.post<ActionItemView>(`/api/cycles/${id(cycleId)}/actions`, action, { context: showsOwnErrors() });
  }

  /** Changes an action with the version it was read at. */
  updateAction(actionId: number, changes: ActionItemUpdateRequest): Observable<ActionItemView> {
    return this.http.patch<ActionItemView>(`/api/actions/${id(actionId)}`, changes, { context: showsOwnErrors() });
  }

  /** Removes an action from its cycle's plan. */
  removeAction(actionId: number): Observable<void> {
    return this.http.delete<void>(`/api/actions/${id(actionId)}`, { context: showsOwnErrors() });
  }

  /** Review notes (partners and the audit lead only). */
  notes(auditId: number): Observable<ReviewNoteView[]> {
    return this.http.get<ReviewNoteView[]>(`/api/audits/${id(auditId)}/notes`);
  }

  /** Adds a review note about the audit, a standard or a chart, optionally tied to a cycle. */
  addNote(auditId: number, note: ReviewNoteCreateRequest): Observable<ReviewNoteView> {
    return this.http.post<ReviewNoteView>(`/api/audits/${id(auditId)}/notes`, note, { context: showsOwnErrors() });
  }

  /** Each standard's result; live when no cycle is given, else the cycle's (frozen once reported). */
  results(auditId: number, cycleId?: number): Observable<AuditResults> {
    const params = cycleId === undefined ? new HttpParams() : new HttpParams().set('cycleId', cycleId);
    return this.http.get<AuditResults>(`/api/audits/${id(auditId)}/results`, { params });
  }

  /** The re-audit against the first cycle, standard by standard. */
  compare(auditId: number, firstCycleId: number, secondCycleId: number): Observable<CycleComparison> {
    const params = new HttpParams().set('first', firstCycleId).set('second', secondCycleId);
    return this.http.get<CycleComparison>(`/api/audits/${id(auditId)}/compare`, { params, context: showsOwnErrors() });
  }
}

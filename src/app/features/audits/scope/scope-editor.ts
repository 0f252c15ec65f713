import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { auditCreateSchema, type AuditView, type OperatorView, type ScheduleView } from '@tidemark/shared';
import type { Observable } from 'rxjs';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { describeHttpError } from '../../../core/http/describe-http-error';
import { formRevision } from '../../../shared/forms/form-revision';
import { SCHEMA_ERROR, SERVER_ERROR, fieldMessage } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { CohortBuilder } from '../cohort-builder/cohort-builder';
import { issueMessages, placeFieldMessages, revalidate } from '../field-messages';
import { ScheduleDialog, type ScheduleDialogData } from '../schedule-dialog/schedule-dialog';
import { intervalWords } from '../standard-wording';
import { auditRequestFromForm, createAuditForm, fillAuditForm } from './audit-form';

/**
 * The audit lead's scope form: what the audit is, which recall schedule and stability
 * thresholds it uses, and its cohort. Creates a new audit when `audit` is null, else saves
 * changes with the version they were read at.
 */
@Component({
  selector: 'tm-scope-editor',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CohortBuilder, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './scope-editor.html',
  styleUrl: './scope-editor.scss',
})
export class ScopeEditor {
  private readonly api = inject(AuditsApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly dialog = inject(MatDialog);

  /** The audit being edited; null to define a new one. */
  readonly audit = input<AuditView | null>(null);
  /** Who leads it, in words (the lead is the person who creates the audit). */
  readonly leadName = input.required<string>();
  /** Operators for the cohort's operator chips. */
  readonly operators = input<readonly OperatorView[]>([]);
  /** Emits the audit as the server saved it. */
  readonly saved = output<AuditView>();
  /** Asks the page to load the audit again (someone else changed it). */
  readonly reloadRequested = output<void>();

  protected readonly form = createAuditForm();
  protected readonly fieldMessage = fieldMessage;
  protected readonly schedules = signal<ScheduleView[]>([]);
  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly isStale = signal(false);
  private readonly revision = formRevision(signal(this.form));

  protected readonly isNew = computed(() => this.audit() === null);
  protected readonly chosenSchedule = computed(() => {
    this.revision();
    const id = this.form.controls.scheduleId.value;
    return this.schedules().find((schedule) => schedule.id === id) ?? null;
  });
  protected readonly hasChanges = computed(() => {
    this.revision();
    return this.form.dirty;
  });
  protected readonly intervalWords = intervalWords;
  /** The schedule recalls are entered against, which a new schedule picks its intervals from. */
  protected readonly practiceSchedule = computed(() => this.schedules().find((schedule) => schedule.isDefault) ?? null);

  constructor() {
    // The page reloads the audit after changes elsewhere (a standard, a cycle); only a new
    // version of the scope itself replaces what is in the form.
    let shown: { id: number; version: number } | null = null;
    effect(() => {
      const audit = this.audit();
      untracked(() => {
        if (!audit || (shown?.id === audit.id && shown.version === audit.version)) return;
        shown = { id: audit.id, version: audit.version };
        fillAuditForm(this.form, audit);
        this.isStale.set(false);
        this.failure.set(null);
      });
    });
    this.api
      .schedules()
      .pipe(takeUntilDestroyed())
      .subscribe((schedules) => {
        this.schedules.set(schedules);
        const scheduleId = this.form.controls.scheduleId;
        // A new audit starts on the practice's default schedule.
        if (scheduleId.value === null) scheduleId.setValue(schedules.find((schedule) => schedule.isDefault)?.id ?? null);
      });
  }

  protected saveScope(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    revalidate(this.form);
    const request = auditRequestFromForm(this.form);
    const parsed = request ? auditCreateSchema.safeParse(request) : null;
    // The whole schema once more, for the rules across fields (relapse ≥ stable, range order).
    const unplaced = parsed && !parsed.success ? placeFieldMessages(this.form, issueMessages(parsed.error.issues), SCHEMA_ERROR) : [];
    if (this.form.invalid || !request || !parsed?.success) {
      this.form.markAllAsTouched();
      this.failure.set(unplaced.length ? unplaced.join(' ') : 'Some entries need correcting before the audit can be saved.');
      return;
    }
    this.isSaving.set(true);
    const audit = this.audit();
    const call: Observable<AuditView> = audit ? this.api.update(audit.id, { ...request, version: audit.version }) : this.api.create(request);
    call.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (saved) => {
        this.isSaving.set(false);
        this.form.markAsPristine();
        this.saved.emit(saved);
      },
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.showFailure(error);
      },
    });
  }

  /** Defines a new recall schedule and chooses it for this audit. */
  protected defineSchedule(): void {
    const practice = this.practiceSchedule();
    if (!practice) return;
    this.dialog
      .open<ScheduleDialog, ScheduleDialogData, ScheduleView>(ScheduleDialog, { data: { practice }, maxWidth: '680px', autoFocus: 'first-tabbable' })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((saved) => {
        if (!saved) return;
        this.schedules.update((schedules) => [...schedules, saved]);
        this.form.controls.scheduleId.setValue(saved.id);
        this.form.controls.scheduleId.markAsDirty();
      });
  }

  protected discardChanges(): void {
    const audit = this.audit();
    if (audit) fillAuditForm(this.form, audit);
    this.failure.set(null);
  }

  protected reloadAudit(): void {
    this.reloadRequested.emit();
  }

  private showFailure(error: unknown): void {
    if (!(error instanceof HttpErrorResponse)) {
      this.failure.set('The audit could not be saved. Try again.');
      return;
    }
    if (error.status === 409) {
      this.isStale.set(true);
      this.failure.set('Someone else changed this audit since you opened it. Reload to see their changes; your edits here will be replaced.');
      return;
    }
    const details = apiErrorDetails(error);
    const unplaced = placeFieldMessages(this.form, details?.fields ?? {}, SERVER_ERROR);
    const fieldCount = Object.keys(details?.fields ?? {}).length;
    if (fieldCount === 0 || unplaced.length > 0) {
      this.failure.set([details && error.status < 500 ? details.message : describeHttpError(error), ...unplaced].join(' '));
    }
  }
}

import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { reviewNoteCreateSchema, type AuditView, type ReviewNoteView } from '@tidemark/shared';
import { catchError, of, switchMap, tap } from 'rxjs';
import { apiErrorDetails } from '../../../core/http/api-error-details';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AuditsApi } from '../audits-api';
import { failureSentence } from '../failure-sentence';
import { placeFieldMessages } from '../field-messages';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Charts a note can be about, by their topic key (the results board's chart titles). */
const CHART_TOPICS: readonly { readonly topic: string; readonly label: string }[] = [
  { topic: 'chart:drift', label: 'Chart: margin drift by interval' },
  { topic: 'chart:funnel', label: 'Chart: complications by operator' },
  { topic: 'chart:completion', label: 'Chart: recall completion' },
];

/** Review notes of partners and the audit lead: what they noticed in the results, for the next meeting. */
@Component({
  selector: 'tm-review-notes',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './review-notes.html',
  styleUrl: './review-notes.scss',
})
export class ReviewNotes {
  private readonly api = inject(AuditsApi);
  private readonly destroyRef = inject(DestroyRef);

  /** The audit the notes belong to. */
  readonly audit = input.required<AuditView>();

  /** The form's directive: resetting through it also forgets the submit, so the emptied note shows no error. */
  private readonly formDirective = viewChild.required(FormGroupDirective);
  protected readonly notes = signal<ReviewNoteView[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  protected readonly isSaving = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  protected readonly form = new FormGroup({
    topic: new FormControl('audit', { nonNullable: true }),
    cycleId: new FormControl<number | null>(null),
    text: new FormControl('', { nonNullable: true, validators: zodValidator(reviewNoteCreateSchema.shape.text) }),
  });

  protected readonly topics = computed(() => [
    { topic: 'audit', label: 'The audit as a whole' },
    ...this.audit().standards.map((standard) => ({ topic: `standard:${standard.id}`, label: `Standard ${standard.position}: ${standard.criterion}` })),
    ...CHART_TOPICS,
  ]);
  protected readonly shownNotes = computed(() => {
    const topics = new Map(this.topics().map((entry) => [entry.topic, entry.label]));
    const cycles = new Map(this.audit().cycles.map((cycle) => [cycle.id, cycle.number]));
    return [...this.notes()]
      .sort((a, b) => b.createdAt.localeCompare(a.createdAt))
      .map((note) => ({
        note,
        topic: topics.get(note.topic) ?? note.topic,
        cycle: note.cycleId === null ? null : (cycles.get(note.cycleId) ?? null),
      }));
  });

  constructor() {
    toObservable(computed(() => this.audit().id))
      .pipe(
        tap(() => this.isLoading.set(true)),
        switchMap((auditId) => this.api.notes(auditId).pipe(catchError(() => of(null)))),
        takeUntilDestroyed(),
      )
      .subscribe((notes) => {
        this.isLoading.set(false);
        this.hasLoadFailed.set(notes === null);
        this.notes.set(notes ?? []);
      });
  }

  protected addNote(): void {
    if (this.isSaving()) return;
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.isSaving.set(true);
    this.api
      .addNote(this.audit().id, { topic: value.topic, cycleId: value.cycleId, text: value.text.trim() })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (note) => {
          this.isSaving.set(false);
          this.notes.update((notes) => [...notes, note]);
          this.formDirective().resetForm({ topic: value.topic, cycleId: value.cycleId, text: '' });
        },
        error: (error: unknown) => {
          this.isSaving.set(false);
          const fields = error instanceof HttpErrorResponse ? (apiErrorDetails(error)?.fields ?? {}) : {};
          const unplaced = placeFieldMessages(this.form, fields, SERVER_ERROR);
          if (Object.keys(fields).length === 0 || unplaced.length > 0) this.failure.set(failureSentence(error));
        },
      });
  }
}

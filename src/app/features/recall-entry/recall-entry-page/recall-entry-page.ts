import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, OnInit, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { CASE_STATUS_LABELS, SITE_LOCATION_LABELS, type CaseDetail } from '@tidemark/shared';
import { Observable, filter } from 'rxjs';
import { ClinicalCaution } from '../../../shared/clinical-caution/clinical-caution';
import { formRevision } from '../../../shared/forms/form-revision';
import { SERVER_ERROR } from '../../../shared/forms/zod-validator';
import { MillimetresPipe } from '../../../shared/millimetres/millimetres-pipe';
import { LargeChangeDialog, type LargeChange } from '../large-change-dialog/large-change-dialog';
import { RecallEntryApi } from '../recall-entry-api';
import { gridOrder, isLargeChange, previousReadings, scheduleInterval } from '../recall-context';
import { controlForPath, createRecallForm, prepareRecallForm, visitCreateRequest, visitUpdateRequest } from '../recall-form';
import { RecallGrid, type RecallRow } from '../recall-grid/recall-grid';
import { RecallHeader } from '../recall-header/recall-header';
import { VisitFields } from '../visit-fields/visit-fields';
import { readVisitSaveFailure } from '../visit-save-failure';

/** Case states that take a new recall (the server refuses the others). */
const OPEN_FOR_RECALLS: ReadonlySet<string> = new Set(['operated', 'in-recall']);

const mm = new MillimetresPipe();

/**
 * Recall entry: one recall of one case, site by site, with live outcomes, the large-change
 * confirmation and, when the interval is already recorded, correction with a reason.
 */
@Component({
  selector: 'tm-recall-entry-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, ClinicalCaution, RecallGrid, RecallHeader, VisitFields],
  templateUrl: './recall-entry-page.html',
  styleUrl: './recall-entry-page.scss',
})
export class RecallEntryPage implements OnInit {
  private readonly api = inject(RecallEntryApi);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  /** Route parameter: the case id. */
  readonly caseId = input.required<string>();
  /** Route parameter: the interval key of the recall schedule (e.g. `6w`). */
  readonly intervalKey = input.required<string>();

  protected readonly form = createRecallForm();
  private readonly revision = formRevision(signal(this.form).asReadonly());

  protected readonly detail = signal<CaseDetail | null>(null);
  protected readonly loadState = signal<'loading' | 'loaded' | 'failed'>('loading');
  protected readonly isSaving = signal(false);
  /** A problem that belongs to no single field. */
  protected readonly failure = signal<string | null>(null);
  /** Set when someone else saved this recall first; the page offers a reload. */
  protected readonly staleNotice = signal<string | null>(null);
  /** The server's large-change notes by site id, when it asked for a confirmation. */
  private readonly serverNotes = signal<ReadonlyMap<number, string>>(new Map());

  protected readonly interval = computed(() => scheduleInterval(this.intervalKey()));
  /** The visit already recorded for this interval: the page then corrects it. */
  protected readonly recorded = computed(() => this.detail()?.visits.find((visit) => visit.intervalKey === this.intervalKey()) ?? null);
  protected readonly isCorrection = computed(() => this.recorded() !== null);
  protected readonly teeth = computed(() => [...new Set(this.sites().map((site) => site.tooth))]);
  private readonly sites = computed(() => gridOrder(this.detail()?.sites ?? []));

  /** Why this recall cannot be entered here, if it cannot. */
  protected readonly blocker = computed(() => {
    const detail = this.detail();
    if (!detail) {
      return null;
    }
    if (!this.interval()) {
      return `“${this.intervalKey()}” is not an interval of the recall schedule.`;
    }
    if (!this.isCorrection() && !OPEN_FOR_RECALLS.has(detail.status)) {
      return `This case is ${CASE_STATUS_LABELS[detail.status].toLowerCase()}, so it does not take recall visits.`;
    }
    return detail.sites.length ? null : 'This case has no sites to measure.';
  });

  protected readonly visitDate = computed(() => {
    this.revision();
    return this.form.controls.visitDate.value;
  });

  private readonly previous = computed(() => {
    const detail = this.detail();
    return detail ? previousReadings(detail, this.visitDate(), this.recorded()?.id ?? null) : new Map();
  });

  protected readonly rows = computed<RecallRow[]>(() => {
    const groups = this.form.controls.measurements.controls;
    return this.sites().flatMap((site, index) => {
      const group = groups[index];
      return group ? [{ site, group, previous: this.previous().get(site.id) ?? null, serverNote: this.serverNotes().get(site.id) ?? null }] : [];
    });
  });

  ngOnInit(): void {
    this.loadCase();
  }

  /** Loads (or reloads) the case and fits the form to it; a reload drops what was typed. */
  protected loadCase(): void {
    const id = Number(this.caseId());
    this.loadState.set('loading');
    this.staleNotice.set(null);
    this.failure.set(null);
    this.serverNotes.set(new Map());
    if (!Number.isInteger(id) || id <= 0) {
      this.loadState.set('failed');
      return;
    }
    this.api
      .getCase(id)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (detail) => {
          const recorded = detail.visits.find((visit) => visit.intervalKey === this.intervalKey()) ?? null;
          prepareRecallForm(this.form, gridOrder(detail.sites), detail.surgeryDate, recorded);
          this.detail.set(detail);
          this.loadState.set('loaded');
        },
        // The error notice has said why; the page offers a retry.
        error: () => this.loadState.set('failed'),
      });
  }

  protected saveVisit(): void {
    if (this.isSaving()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.failure.set('Some entries need correcting: see the marked fields.');
      this.host.nativeElement.querySelector<HTMLElement>('input.ng-invalid, textarea.ng-invalid')?.focus();
      return;
    }
    const changes = this.largeChanges();
    if (changes.length) {
      this.confirmThenSend(changes);
    } else {
      this.send(false);
    }
  }

  /** Sites whose REF→GM moved more than 3 mm from the previous reading, in words. */
  private largeChanges(): LargeChange[] {
    return this.rows().flatMap(({ site, group, previous }) => {
      const refGm = group.controls.refGm.value;
      if (refGm === null || previous === null || !isLargeChange(refGm, previous)) {
        return [];
      }
      return [
        {
          site: `${site.tooth} · ${SITE_LOCATION_LABELS[site.location]}`,
          detail: `${mm.transform(previous.refGm)} → ${mm.transform(refGm)} (${mm.transform(Math.abs(refGm - previous.refGm))} since the ${previous.source} reading)`,
        },
      ];
    });
  }

  private confirmThenSend(changes: readonly LargeChange[]): void {
    this.dialog
      .open<LargeChangeDialog, readonly LargeChange[], boolean>(LargeChangeDialog, { data: changes, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((isConfirmed) => isConfirmed === true),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() => this.send(true));
  }

  private send(confirmLargeChange: boolean): void {
    const detail = this.detail();
    if (!detail) {
      return;
    }
    const recorded = this.recorded();
    let saving: Observable<CaseDetail>;
    if (recorded) {
      const candidate = visitUpdateRequest(this.form, recorded.version, confirmLargeChange);
      if (!candidate.isValid) {
        this.showFieldErrors(candidate.fields, 'Some entries need correcting.');
        return;
      }
      saving = this.api.correctVisit(recorded.id, candidate.request);
    } else {
      const candidate = visitCreateRequest(this.form, this.intervalKey(), confirmLargeChange);
      if (!candidate.isValid) {
        this.showFieldErrors(candidate.fields, 'Some entries need correcting.');
        return;
      }
      saving = this.api.recordVisit(detail.id, candidate.request);
    }
    this.isSaving.set(true);
    saving.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (saved) => this.showCase(saved, recorded !== null),
      error: (error: unknown) => {
        this.isSaving.set(false);
        this.showFailure(error);
      },
    });
  }

  private showCase(saved: CaseDetail, wasCorrection: boolean): void {
    const label = this.interval()?.label ?? this.intervalKey();
    this.snackBar.open(`${label} recall ${wasCorrection ? 'corrected' : 'saved'} for ${saved.patient.code}.`, 'OK', { duration: 6000 });
    void this.router.navigate(['/cases', saved.id]);
  }

  private showFailure(error: unknown): void {
    const failure = readVisitSaveFailure(error);
    switch (failure.kind) {
      case 'needs-confirmation': {
        const notes = new Map<number, string>();
        const changes: LargeChange[] = [];
        for (const [path, message] of Object.entries(failure.fields)) {
          const row = this.rows()[Number(/^measurements\.(\d+)\.refGm$/.exec(path)?.[1] ?? -1)];
          if (row) {
            notes.set(row.site.id, message);
            changes.push({ site: `${row.site.tooth} · ${SITE_LOCATION_LABELS[row.site.location]}`, detail: message });
          }
        }
        this.serverNotes.set(notes);
        this.confirmThenSend(changes.length ? changes : [{ site: 'Readings', detail: failure.message }]);
        return;
      }
      case 'stale':
        this.staleNotice.set(
          this.isCorrection()
            ? 'Someone else changed this recall while you were correcting it.'
            : 'This recall was recorded by someone else in the meantime.',
        );
        return;
      case 'fields':
        this.showFieldErrors(failure.fields, failure.message);
        return;
      case 'other':
        this.failure.set(failure.message);
    }
  }

  /** Puts each message on its control; what fits no control is said once above the buttons. */
  private showFieldErrors(fields: Record<string, string>, summary: string): void {
    const unplaced: string[] = [];
    for (const [path, message] of Object.entries(fields)) {
      const control = controlForPath(this.form, path);
      if (control) {
        control.setErrors({ ...control.errors, [SERVER_ERROR]: message });
        control.markAsTouched();
      } else {
        unplaced.push(message);
      }
    }
    this.failure.set([summary, ...unplaced].join(' '));
  }
}

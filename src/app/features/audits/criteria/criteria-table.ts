import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { STANDARD_METRIC_INFO, type AuditResults, type AuditView, type StandardResult, type StandardView } from '@tidemark/shared';
import { filter, switchMap } from 'rxjs';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/confirm-dialog/confirm-dialog';
import { AuditsApi } from '../audits-api';
import { failureSentence } from '../failure-sentence';
import { VerdictBadge } from '../badges/verdict-badge';
import { StandardDialog, type StandardDialogData } from '../standard-dialog/standard-dialog';
import { formatObserved, formatTarget, standardParameters } from '../standard-wording';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One row: the standard in words and its latest result. */
interface CriterionRow {
  readonly standard: StandardView;
  readonly measure: string;
  readonly parameters: string[];
  readonly target: string;
  readonly observed: string | null;
  readonly verdict: StandardResult['verdict'] | null;
}

/** The Criteria area: each standard of the audit with its target, evidence, exceptions and latest result. */
@Component({
  selector: 'tm-criteria-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule, VerdictBadge],
  templateUrl: './criteria-table.html',
  styleUrl: './criteria-table.scss',
})
export class CriteriaTable {
  private readonly api = inject(AuditsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);

  /** The audit whose standards are listed. */
  readonly audit = input.required<AuditView>();
  /** Live results, once loaded; null while loading or when they failed. */
  readonly results = input<AuditResults | null>(null);
  /** Whether the results are on their way. */
  readonly isLoadingResults = input(false);
  /** Whether the reader may add, change and remove standards (audit lead). */
  readonly canWrite = input(false);
  /** Emits after a standard was added, changed or removed. */
  readonly changed = output<void>();

  protected readonly columns = computed(() => {
    const columns = ['criterion', 'measure', 'target', 'evidence', 'result'];
    return this.canWrite() ? [...columns, 'actions'] : columns;
  });

  protected readonly rows = computed<CriterionRow[]>(() => {
    const audit = this.audit();
    const results = new Map((this.results()?.standards ?? []).map((result) => [result.standard.id, result]));
    return audit.standards.map((standard) => {
      const result = results.get(standard.id);
      const unit = STANDARD_METRIC_INFO[standard.metric].unit;
      return {
        standard,
        measure: STANDARD_METRIC_INFO[standard.metric].label,
        parameters: standardParameters(standard, audit.schedule.intervals),
        target: formatTarget(standard),
        observed: result?.observed ? formatObserved(result.observed, unit) : null,
        verdict: result?.verdict ?? null,
      };
    });
  });

  protected addStandard(): void {
    this.openDialog({ auditId: this.audit().id, intervals: this.audit().schedule.intervals });
  }

  protected editStandard(standard: StandardView): void {
    this.openDialog({ auditId: this.audit().id, intervals: this.audit().schedule.intervals, standard });
  }

  protected removeStandard(standard: StandardView): void {
    const data: ConfirmDialogData = {
      title: 'Remove this standard?',
      paragraphs: [`“${standard.criterion}” leaves the audit. Cycles already reported keep it in their frozen results.`],
      confirmLabel: 'Remove standard',
      icon: 'delete',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '520px' })
      .afterClosed()
      .pipe(
        filter((isConfirmed) => isConfirmed === true),
        switchMap(() => this.api.removeStandard(standard.id)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: () => {
          this.snackBar.open('The standard was removed.', 'OK', { duration: 6000 });
          this.changed.emit();
        },
        error: (error: unknown) => this.snackBar.open(failureSentence(error), 'OK', { duration: 8000 }),
      });
  }

  private openDialog(data: StandardDialogData): void {
    this.dialog
      .open<StandardDialog, StandardDialogData, StandardView>(StandardDialog, { data, maxWidth: '640px', autoFocus: 'first-tabbable' })
      .afterClosed()
      .pipe(
        filter((saved) => saved !== undefined),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() => {
        this.snackBar.open(data.standard ? 'The standard was saved.' : 'The standard was added.', 'OK', { duration: 6000 });
        this.changed.emit();
      });
  }
}

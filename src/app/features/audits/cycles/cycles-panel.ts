import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { CYCLE_STATE_LABELS, todayIso, type AuditView, type CycleView, type OperatorView } from '@tidemark/shared';
import { EMPTY, Observable, filter, of, switchMap } from 'rxjs';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/confirm-dialog/confirm-dialog';
import { ActionPlan } from '../action-plan/action-plan';
import { AuditsApi } from '../audits-api';
import { CycleStageBadge } from '../badges/cycle-stage-badge';
import { CycleDialog, type CycleDialogData } from '../cycle-dialog/cycle-dialog';
import { failureSentence } from '../failure-sentence';
import { stageMovesFrom, type StageMove } from './stage-moves';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

const DAY_MS = 86_400_000;

/** The cycles of an audit in order — period, stage, frozen and presented dates, stage moves — each with its action plan. */
@Component({
  selector: 'tm-cycles-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ActionPlan, CycleStageBadge, LocalDatePipe, MatButtonModule, MatIconModule],
  templateUrl: './cycles-panel.html',
  styleUrl: './cycles-panel.scss',
})
export class CyclesPanel {
  private readonly api = inject(AuditsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);

  /** The audit whose cycles are shown. */
  readonly audit = input.required<AuditView>();
  /** Whether the reader may open, move and change cycles and plans (audit lead). */
  readonly canWrite = input(false);
  /** Who may own an action. */
  readonly owners = input<readonly OperatorView[]>([]);
  /** Emits when a cycle or an action changed, or the audit should be read again. */
  readonly changed = output<void>();

  protected readonly cycles = computed(() =>
    [...this.audit().cycles]
      .sort((a, b) => a.number - b.number)
      .map((cycle) => ({ cycle, moves: this.canWrite() ? stageMovesFrom(cycle.state) : [] })),
  );

  protected openNewCycle(): void {
    const last = this.audit().cycles.at(-1);
    const suggestedStart = last ? new Date(Date.parse(`${last.periodEnd}T00:00:00Z`) + DAY_MS).toISOString().slice(0, 10) : undefined;
    this.openCycleDialog({ auditId: this.audit().id, suggestedStart, suggestedEnd: todayIso() }, 'The cycle was opened.');
  }

  protected editCycle(cycle: CycleView): void {
    this.openCycleDialog({ auditId: this.audit().id, cycle }, 'The cycle was saved.');
  }

  protected moveStage(cycle: CycleView, move: StageMove): void {
    this.confirmMove(cycle, move)
      .pipe(
        switchMap(() => this.api.updateCycle(cycle.id, { state: move.to, version: cycle.version })),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (saved) => {
          const frozen = saved.state === 'reported' ? ' Its results are frozen.' : '';
          this.snackBar.open(`Cycle ${saved.number} is now at “${CYCLE_STATE_LABELS[saved.state]}”.${frozen}`, 'OK', { duration: 6000 });
          this.changed.emit();
        },
        error: (error: unknown) => this.showFailure(error),
      });
  }

  protected removeCycle(cycle: CycleView): void {
    const data: ConfirmDialogData = {
      title: `Delete cycle ${cycle.number}?`,
      paragraphs: ['The cycle and its action plan are removed. Only cycles not yet reported can be deleted.'],
      confirmLabel: 'Delete cycle',
      icon: 'delete',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '520px' })
      .afterClosed()
      .pipe(
        filter((isConfirmed) => isConfirmed === true),
        switchMap(() => this.api.removeCycle(cycle.id)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({ next: () => this.changed.emit(), error: (error: unknown) => this.showFailure(error) });
  }

  protected reload(): void {
    this.changed.emit();
  }

  /** Reporting freezes a cycle's results for good, so it is confirmed first; other moves go straight through. */
  private confirmMove(cycle: CycleView, move: StageMove): Observable<true> {
    if (move.to !== 'reported') return of(true);
    const data: ConfirmDialogData = {
      title: `Report cycle ${cycle.number}?`,
      paragraphs: [
        'The results will be frozen: every standard’s result, as computed now, is kept with the cycle. Later changes to cases, recalls or standards will not alter them.',
        'A reported cycle cannot be deleted; it becomes part of the governance record.',
      ],
      confirmLabel: 'Report and freeze results',
      icon: 'lock',
    };
    return this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '560px' })
      .afterClosed()
      .pipe(switchMap((isConfirmed) => (isConfirmed === true ? of<true>(true) : EMPTY)));
  }

  private openCycleDialog(data: CycleDialogData, doneText: string): void {
    this.dialog
      .open<CycleDialog, CycleDialogData, CycleView>(CycleDialog, { data, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((saved) => saved !== undefined),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() => {
        this.snackBar.open(doneText, 'OK', { duration: 6000 });
        this.changed.emit();
      });
  }

  private showFailure(error: unknown): void {
    if (error instanceof HttpErrorResponse && error.status === 409) {
      const ref = this.snackBar.open('Someone else changed this cycle since you opened the audit.', 'Reload', { duration: 10000 });
      ref.onAction().subscribe(() => this.changed.emit());
      return;
    }
    this.snackBar.open(failureSentence(error), 'OK', { duration: 8000 });
  }
}

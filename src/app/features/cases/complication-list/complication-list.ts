import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { CLAVIEN_DINDO_LABELS, COMPLICATION_TYPE_LABELS, type ComplicationView, type VisitView } from '@tidemark/shared';
import { filter } from 'rxjs';
import { ComplicationDialog, type ComplicationDialogData } from '../complication-dialog/complication-dialog';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** A complication with its words looked up once. */
interface ComplicationRow {
  readonly complication: ComplicationView;
  readonly type: string;
  /** The grade's explanation, without the grade itself (shown apart). */
  readonly gradeMeaning: string;
  readonly visitLabel: string | null;
}

/** The case's complications, graded after Clavien–Dindo, with add and correct for writers. */
@Component({
  selector: 'tm-complication-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule],
  templateUrl: './complication-list.html',
  styleUrl: './complication-list.scss',
})
export class ComplicationList {
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);

  readonly caseId = input.required<number>();
  readonly complications = input.required<readonly ComplicationView[]>();
  readonly visits = input.required<readonly VisitView[]>();
  readonly canWrite = input(false);
  /** Emits after a complication was added or corrected, so the page can refresh the case. */
  readonly changed = output<ComplicationView>();

  protected readonly rows = computed<ComplicationRow[]>(() =>
    this.complications().map((complication) => {
      const visit = this.visits().find((candidate) => candidate.id === complication.visitId);
      return {
        complication,
        type: COMPLICATION_TYPE_LABELS[complication.type],
        gradeMeaning: CLAVIEN_DINDO_LABELS[complication.grade].replace(/^\S+ — /, ''),
        visitLabel: visit ? `${visit.intervalLabel} recall` : null,
      };
    }),
  );

  protected addComplication(): void {
    this.openDialog({ caseId: this.caseId(), visits: this.visits() });
  }

  protected correctComplication(complication: ComplicationView): void {
    this.openDialog({ caseId: this.caseId(), visits: this.visits(), complication });
  }

  private openDialog(data: ComplicationDialogData): void {
    this.dialog
      .open<ComplicationDialog, ComplicationDialogData, ComplicationView>(ComplicationDialog, { data, maxWidth: '600px', autoFocus: 'first-tabbable' })
      .afterClosed()
      .pipe(
        filter((saved): saved is ComplicationView => saved !== undefined),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((saved) => this.changed.emit(saved));
  }
}

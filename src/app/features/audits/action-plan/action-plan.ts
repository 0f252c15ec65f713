import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { todayIso, type ActionItemView, type CycleView, type OperatorView } from '@tidemark/shared';
import { filter, switchMap } from 'rxjs';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/confirm-dialog/confirm-dialog';
import { ActionDialog, type ActionDialogData } from '../action-dialog/action-dialog';
import { AuditsApi } from '../audits-api';
import { failureSentence } from '../failure-sentence';
import { ActionStateBadge, isActionOverdue } from '../badges/action-state-badge';
import { OverdueMarker } from '../badges/overdue-marker';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** A cycle's action plan: action, owner, due date and state, with overdue actions marked. */
@Component({
  selector: 'tm-action-plan',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ActionStateBadge, LocalDatePipe, MatButtonModule, MatIconModule, MatTableModule, OverdueMarker],
  template: `
    <div class="head">
      <h4>Action plan</h4>
      @if (canWrite()) {
        <button mat-stroked-button type="button" (click)="addAction()">
          <mat-icon aria-hidden="true">add_task</mat-icon>
          Add action
        </button>
      }
    </div>
    @if (rows().length === 0) {
      <p class="empty">No actions agreed for this cycle yet.{{ canWrite() ? ' Record what the team agreed with Add action.' : '' }}</p>
    } @else {
      <div class="frame">
        <table mat-table [dataSource]="rows()" [attr.aria-label]="'Action plan of cycle ' + cycle().number">
          <ng-container matColumnDef="action">
            <th mat-header-cell *matHeaderCellDef>Action</th>
            <td mat-cell *matCellDef="let row">{{ row.action.action }}</td>
          </ng-container>
          <ng-container matColumnDef="owner">
            <th mat-header-cell *matHeaderCellDef>Owner</th>
            <td mat-cell *matCellDef="let row">{{ row.action.owner.displayName }}</td>
          </ng-container>
          <ng-container matColumnDef="due">
            <th mat-header-cell *matHeaderCellDef>Due by</th>
            <td mat-cell *matCellDef="let row" class="nowrap">{{ row.action.dueDate | localDate }}</td>
          </ng-container>
          <ng-container matColumnDef="state">
            <th mat-header-cell *matHeaderCellDef>State</th>
            <td mat-cell *matCellDef="let row">
              <span class="state">
                <tm-action-state-badge [state]="row.action.state" />
                @if (row.isOverdue) {
                  <tm-overdue-marker />
                }
              </span>
            </td>
          </ng-container>
          <ng-container matColumnDef="edit">
            <th mat-header-cell *matHeaderCellDef><span class="tm-visually-hidden">Change</span></th>
            <td mat-cell *matCellDef="let row" class="nowrap">
              <button mat-icon-button type="button" (click)="editAction(row.action)" [attr.aria-label]="'Change action: ' + row.action.action">
                <mat-icon>edit</mat-icon>
              </button>
              <button mat-icon-button type="button" (click)="removeAction(row.action)" [attr.aria-label]="'Remove action: ' + row.action.action">
                <mat-icon>delete</mat-icon>
              </button>
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns()"></tr>
          <tr mat-row *matRowDef="let row; columns: columns()" [class.overdue]="row.isOverdue"></tr>
        </table>
      </div>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 8px;
    }
    .head {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      justify-content: space-between;
      gap: 8px;
    }
    h4 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .head button {
      min-height: 48px;
    }
    .empty {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .frame {
      overflow-x: auto;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
    }
    table {
      min-width: 640px;
    }
    .state {
      display: inline-flex;
      flex-wrap: wrap;
      gap: 6px;
    }
    .nowrap {
      white-space: nowrap;
    }
    tr.overdue td:first-child {
      box-shadow: inset 4px 0 0 var(--tm-attention);
    }
  `,
})
export class ActionPlan {
  private readonly api = inject(AuditsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);

  /** The cycle whose plan is shown. */
  readonly cycle = input.required<CycleView>();
  /** Whether the reader may change the plan (audit lead). */
  readonly canWrite = input(false);
  /** Who may own an action. */
  readonly owners = input<readonly OperatorView[]>([]);
  /** Today, `YYYY-MM-DD`, for the overdue marker. */
  readonly today = input(todayIso());
  /** Emits after an action was added, changed or removed. */
  readonly changed = output<void>();

  protected readonly columns = computed(() => (this.canWrite() ? ['action', 'owner', 'due', 'state', 'edit'] : ['action', 'owner', 'due', 'state']));
  protected readonly rows = computed(() => this.cycle().actions.map((action) => ({ action, isOverdue: isActionOverdue(action, this.today()) })));

  protected addAction(): void {
    this.openDialog({ cycleId: this.cycle().id, owners: this.owners() });
  }

  protected editAction(action: ActionItemView): void {
    // The owner stays choosable even if they are no longer in the operator list.
    const owners = this.owners().some((owner) => owner.id === action.owner.id) ? this.owners() : [action.owner, ...this.owners()];
    this.openDialog({ cycleId: this.cycle().id, owners, action });
  }

  protected removeAction(action: ActionItemView): void {
    const data: ConfirmDialogData = { title: 'Remove this action?', paragraphs: [`“${action.action}” leaves the plan.`], confirmLabel: 'Remove action', icon: 'delete' };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '520px' })
      .afterClosed()
      .pipe(
        filter((isConfirmed) => isConfirmed === true),
        switchMap(() => this.api.removeAction(action.id)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: () => this.changed.emit(),
        error: (error: unknown) => this.snackBar.open(failureSentence(error), 'OK', { duration: 8000 }),
      });
  }

  private openDialog(data: ActionDialogData): void {
    this.dialog
      .open<ActionDialog, ActionDialogData, ActionItemView>(ActionDialog, { data, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((saved) => saved !== undefined),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() => this.changed.emit());
  }
}

import { ChangeDetectionStrategy, Component, effect, input, viewChild } from '@angular/core';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import type { ImportRowError } from '../case-import-api';

/** A rejected file's problems, row by row, a page at a time. */
@Component({
  selector: 'tm-import-error-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatPaginatorModule, MatTableModule],
  template: `
    <div class="frame">
      <div class="scroll">
        <table mat-table [dataSource]="problems" class="problems">
          <caption class="tm-visually-hidden">Rows to correct</caption>
          <ng-container matColumnDef="row">
            <th mat-header-cell *matHeaderCellDef>Row</th>
            <td mat-cell *matCellDef="let problem" class="row-number">{{ problem.row }}</td>
          </ng-container>
          <ng-container matColumnDef="column">
            <th mat-header-cell *matHeaderCellDef>Column</th>
            <td mat-cell *matCellDef="let problem"><code>{{ problem.column }}</code></td>
          </ng-container>
          <ng-container matColumnDef="message">
            <th mat-header-cell *matHeaderCellDef>What to correct</th>
            <td mat-cell *matCellDef="let problem">{{ problem.message }}</td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let problem; columns: columns"></tr>
        </table>
      </div>
      <mat-paginator [pageSizeOptions]="[10, 25, 100]" [pageSize]="10" aria-label="Pages of rows to correct" />
    </div>
  `,
  styles: `
    .frame {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      overflow: hidden;
    }
    .scroll {
      overflow-x: auto;
    }
    .problems {
      width: 100%;
      min-width: 560px;
      --mat-table-background-color: var(--mat-sys-surface);
      --mat-table-header-headline-color: var(--mat-sys-on-surface-variant);
    }
    .row-number {
      width: 72px;
      font-variant-numeric: tabular-nums;
    }
    code {
      white-space: nowrap;
    }
    mat-paginator {
      border-top: 1px solid var(--mat-sys-outline-variant);
      --mat-paginator-container-background-color: var(--mat-sys-surface);
    }
  `,
})
export class ImportErrorTable {
  /** The server's row errors, in file order. */
  readonly errors = input.required<readonly ImportRowError[]>();

  protected readonly columns = ['row', 'column', 'message'];
  protected readonly problems = new MatTableDataSource<ImportRowError>([]);
  private readonly paginator = viewChild.required(MatPaginator);

  constructor() {
    effect(() => {
      this.problems.data = [...this.errors()];
      this.problems.paginator = this.paginator();
    });
  }
}

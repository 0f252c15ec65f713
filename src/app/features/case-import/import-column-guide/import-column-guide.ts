import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { IMPORT_COLUMNS, IMPORT_COLUMN_GUIDE, OPTIONAL_IMPORT_COLUMNS, type ImportColumn } from '@tidemark/shared';

/** One line of the guide. */
interface ColumnGuideRow {
  readonly column: ImportColumn;
  readonly isOptional: boolean;
  readonly meaning: string;
}

/** The template's columns in file order, read from the shared import schema so they never drift. */
export const COLUMN_GUIDE_ROWS: readonly ColumnGuideRow[] = IMPORT_COLUMNS.map((column) => ({
  column,
  isOptional: OPTIONAL_IMPORT_COLUMNS.has(column),
  meaning: IMPORT_COLUMN_GUIDE[column],
}));

/** What each template column holds, and whether the file may leave it out. */
@Component({
  selector: 'tm-import-column-guide',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatTableModule],
  template: `
    <div class="scroll">
      <table mat-table [dataSource]="rows" class="guide">
        <caption class="tm-visually-hidden">Columns of the import template</caption>
        <ng-container matColumnDef="column">
          <th mat-header-cell *matHeaderCellDef>Column</th>
          <td mat-cell *matCellDef="let row"><code>{{ row.column }}</code></td>
        </ng-container>
        <ng-container matColumnDef="need">
          <th mat-header-cell *matHeaderCellDef>In the file</th>
          <td mat-cell *matCellDef="let row" class="need">
            <mat-icon aria-hidden="true">{{ row.isOptional ? 'remove_circle_outline' : 'check_circle' }}</mat-icon>
            <span>{{ row.isOptional ? 'May be left out' : 'Must be there' }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="meaning">
          <th mat-header-cell *matHeaderCellDef>What it holds</th>
          <td mat-cell *matCellDef="let row">{{ row.meaning }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
    </div>
  `,
  styles: `
    .scroll {
      overflow-x: auto;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
    }
    .guide {
      width: 100%;
      min-width: 640px;
      --mat-table-row-item-container-height: 48px;
      --mat-table-background-color: var(--mat-sys-surface);
      --mat-table-header-headline-color: var(--mat-sys-on-surface-variant);
    }
    code {
      font-size: 0.95em;
      white-space: nowrap;
    }
    .need {
      white-space: nowrap;
    }
    .need mat-icon {
      width: 18px;
      height: 18px;
      font-size: 18px;
      margin-right: 6px;
      vertical-align: -3px;
    }
  `,
})
export class ImportColumnGuide {
  protected readonly rows = COLUMN_GUIDE_ROWS;
  protected readonly columns = ['column', 'need', 'meaning'];
}

import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';

/** One site whose REF→GM moved more than 3 mm, in words. */
export interface LargeChange {
  /** e.g. "11 · Mid-facial". */
  site: string;
  /** e.g. "9.5 mm → 14.0 mm (4.5 mm from the post-op reading)". */
  detail: string;
}

/**
 * The confirm step before saving a REF→GM more than 3 mm away from the previous reading
 * (DESIGN.md §3): such a jump is usually a different reference point. Closes with true when
 * the readings are confirmed.
 */
@Component({
  selector: 'tm-large-change-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>Check the reference point</h2>
    <mat-dialog-content>
      <p>
        These readings moved more than 3 mm since the last one. That is more than healing usually does and often means the
        probe was read from a different reference point.
      </p>
      <ul class="changes">
        @for (change of changes; track change.site) {
          <li><mat-icon aria-hidden="true">report</mat-icon><strong>{{ change.site }}</strong>&nbsp;{{ change.detail }}</li>
        }
      </ul>
      <p>Save them only if you re-measured from the recorded reference point.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Go back and check</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true">Readings are right — save</button>
    </mat-dialog-actions>
  `,
  styles: `
    .changes {
      margin: 0;
      padding: 0;
      list-style: none;
    }
    li {
      display: flex;
      align-items: flex-start;
      gap: 8px;
      padding: 4px 0;
    }
    mat-icon {
      color: var(--tm-attention);
      flex: none;
    }
    mat-dialog-actions {
      gap: 8px;
      padding: 8px 24px 20px;
    }
  `,
})
export class LargeChangeDialog {
  protected readonly changes = inject<readonly LargeChange[]>(MAT_DIALOG_DATA);
}

import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';

/** What the person is asked to confirm. */
export interface ConfirmDialogData {
  readonly title: string;
  /** One or more short paragraphs saying what will happen. */
  readonly paragraphs: readonly string[];
  /** The confirming button's words: the action itself ("Report and freeze"), never "OK". */
  readonly confirmLabel: string;
  /** Material Symbols ligature shown beside the title. */
  readonly icon?: string;
}

/** Asks before an action that cannot be taken back. Closes with `true` when confirmed. */
@Component({
  selector: 'tm-confirm-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title class="title">
      @if (data.icon) {
        <mat-icon aria-hidden="true">{{ data.icon }}</mat-icon>
      }
      {{ data.title }}
    </h2>
    <mat-dialog-content>
      @for (paragraph of data.paragraphs; track $index) {
        <p>{{ paragraph }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false" cdkFocusInitial>Cancel</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true">{{ data.confirmLabel }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    .title {
      display: flex;
      align-items: center;
      gap: 12px;
    }
    p {
      max-width: 52ch;
      margin: 0 0 12px;
    }
    mat-dialog-actions {
      padding: 8px 24px 20px;
      gap: 8px;
    }
    button {
      min-height: 48px;
    }
  `,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmDialogData>(MAT_DIALOG_DATA);
}

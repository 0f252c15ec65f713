import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import type { UserView } from '@tidemark/shared';

/** What the confirmation is about. */
export interface StatusChangeRequest {
  readonly member: UserView;
  /** True to reactivate, false to deactivate. */
  readonly activate: boolean;
}

/** Asks before an account is deactivated or reactivated; closes with true to go ahead. */
@Component({
  selector: 'tm-status-change-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>{{ title }}</h2>
    <mat-dialog-content>
      <p>{{ consequence }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true" cdkFocusInitial>{{ action }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    p {
      margin: 0;
      max-width: 52ch;
    }
    mat-dialog-actions {
      padding: 8px 24px 20px;
      gap: 8px;
    }
  `,
})
export class StatusChangeDialog {
  private readonly request = inject<StatusChangeRequest>(MAT_DIALOG_DATA);

  protected readonly action = this.request.activate ? 'Reactivate' : 'Deactivate';
  protected readonly title = `${this.action} ${this.request.member.displayName}?`;
  protected readonly consequence = this.request.activate
    ? `${this.request.member.displayName} will be able to sign in again, with the same role and password as before.`
    : `${this.request.member.displayName} will no longer be able to sign in. Their cases, entries and change history stay as they are, and you can reactivate the account later.`;
}

import { ChangeDetectionStrategy, Component, DestroyRef, inject } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { OneTimeCodeRequest } from '@tidemark/shared';
import type { Observable } from 'rxjs';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { OneTimeCodeSubmission } from '../one-time-code-submission';

/** What the dialog asks for and what it does with the code. */
export interface CodePromptData<T> {
  readonly title: string;
  readonly paragraphs: readonly string[];
  /** The button's words: the action itself ("Make new codes"), never "OK". */
  readonly actionLabel: string;
  /** The call to make with the code; the dialog closes with its answer. */
  readonly submit: (request: OneTimeCodeRequest) => Observable<T>;
}

/**
 * Asks for a current one-time code before a change to the person's own codes, makes the
 * call itself (so a wrong code can be corrected in place) and closes with the answer.
 */
@Component({
  selector: 'tm-code-prompt-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content>
        @for (paragraph of data.paragraphs; track $index) {
          <p>{{ paragraph }}</p>
        }
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>One-time code</mat-label>
          <input matInput formControlName="code" autocomplete="one-time-code" inputmode="numeric" maxlength="7" cdkFocusInitial />
          @if (fieldMessage(form.controls.code); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <div class="failure" role="alert">
          @if (failure(); as message) {
            <mat-icon aria-hidden="true">error</mat-icon>
            <span>{{ message }}</span>
          }
        </div>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="isSubmitting()">{{ data.actionLabel }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    p {
      max-width: 52ch;
      margin: 0 0 12px;
    }
    mat-form-field {
      width: 100%;
      margin-top: 4px;
    }
    .failure {
      display: flex;
      gap: 8px;
      margin-top: 12px;
      color: var(--mat-sys-error);
      &:empty {
        display: none;
      }
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
export class CodePromptDialog<T> {
  protected readonly data = inject<CodePromptData<T>>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<CodePromptDialog<T>, T>>(MatDialogRef);

  private readonly submission = new OneTimeCodeSubmission(inject(DestroyRef));
  protected readonly form = this.submission.form;
  protected readonly isSubmitting = this.submission.isSubmitting;
  protected readonly failure = this.submission.failure;
  protected readonly fieldMessage = fieldMessage;

  protected submit(): void {
    this.submission.submit(this.data.submit, (answer) => this.dialogRef.close(answer));
  }
}

import { type DestroyRef, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup } from '@angular/forms';
import { oneTimeCodeSchema, type OneTimeCodeRequest } from '@tidemark/shared';
import type { Observable } from 'rxjs';
import { SERVER_ERROR, zodValidator } from '../../shared/forms/zod-validator';
import { codeFailure } from './code-failure';

/** The form's one control. */
interface OneTimeCodeForm {
  code: FormControl<string>;
}

/**
 * The one-field form that sends a current one-time code (enrolment confirmation, the code
 * prompt): checks the code, sends one request at a time, and puts the server's refusal on
 * the field or above the form.
 */
export class OneTimeCodeSubmission {
  readonly form = new FormGroup<OneTimeCodeForm>({
    code: new FormControl('', { nonNullable: true, validators: zodValidator(oneTimeCodeSchema) }),
  });
  readonly isSubmitting = signal(false);
  readonly failure = signal<string | null>(null);

  constructor(private readonly destroyRef: DestroyRef) {}

  /** Sends the code with `send` when the form is valid; `done` receives the answer. */
  submit<T>(send: (request: OneTimeCodeRequest) => Observable<T>, done: (answer: T) => void): void {
    if (this.isSubmitting()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSubmitting.set(true);
    send(this.form.getRawValue())
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: done,
        error: (error: unknown) => {
          this.isSubmitting.set(false);
          const failure = codeFailure(error);
          if (failure.field) {
            const control = this.form.controls.code;
            control.setErrors({ ...control.errors, [SERVER_ERROR]: failure.field });
            control.markAsTouched();
          }
          this.failure.set(failure.general);
        },
      });
  }
}

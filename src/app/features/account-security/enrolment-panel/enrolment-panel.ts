import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { oneTimeCodeSchema, type EnrolmentConfirmation, type SecondFactorEnrolment } from '@tidemark/shared';
import { SERVER_ERROR, fieldMessage, zodValidator } from '../../../shared/forms/zod-validator';
import { AccountSecurityApi } from '../account-security-api';
import { codeFailure } from '../code-failure';

/** The confirmation form's one control. */
interface ConfirmForm {
  code: FormControl<string>;
}

/**
 * Setting up one-time codes: the QR code to scan, the same key to type by hand, and the
 * first code from the app to prove it works. Emits the confirmation (with the recovery codes).
 */
@Component({
  selector: 'tm-enrolment-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  templateUrl: './enrolment-panel.html',
  styleUrl: './enrolment-panel.scss',
})
export class EnrolmentPanel {
  private readonly api = inject(AccountSecurityApi);
  private readonly destroyRef = inject(DestroyRef);

  /** The secret the server handed out. */
  readonly enrolment = input.required<SecondFactorEnrolment>();
  /** Codes are on; carries the recovery codes and the renewed session. */
  readonly confirmed = output<EnrolmentConfirmation>();
  /** The person stopped the set-up. */
  readonly cancelled = output<void>();

  /** The key in groups of four, easier to copy by hand. */
  protected readonly groupedSecret = computed(() => this.enrolment().secret.match(/.{1,4}/g)?.join(' ') ?? this.enrolment().secret);

  protected readonly form = new FormGroup<ConfirmForm>({
    code: new FormControl('', { nonNullable: true, validators: zodValidator(oneTimeCodeSchema) }),
  });
  protected readonly isSubmitting = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  protected confirm(): void {
    if (this.isSubmitting()) {
      return;
    }
    this.failure.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.isSubmitting.set(true);
    this.api
      .confirmEnrolment(this.form.getRawValue())
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (confirmation) => this.confirmed.emit(confirmation),
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

  protected cancel(): void {
    this.cancelled.emit();
  }
}

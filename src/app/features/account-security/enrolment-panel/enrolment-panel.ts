import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { EnrolmentConfirmation, SecondFactorEnrolment } from '@tidemark/shared';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { AccountSecurityApi } from '../account-security-api';
import { OneTimeCodeSubmission } from '../one-time-code-submission';

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

  /** The secret the server handed out. */
  readonly enrolment = input.required<SecondFactorEnrolment>();
  /** Codes are on; carries the recovery codes and the renewed session. */
  readonly confirmed = output<EnrolmentConfirmation>();
  /** The person stopped the set-up. */
  readonly cancelled = output<void>();

  /** The key in groups of four, easier to copy by hand. */
  protected readonly groupedSecret = computed(() => this.enrolment().secret.match(/.{1,4}/g)?.join(' ') ?? this.enrolment().secret);

  private readonly submission = new OneTimeCodeSubmission(inject(DestroyRef));
  protected readonly form = this.submission.form;
  protected readonly isSubmitting = this.submission.isSubmitting;
  protected readonly failure = this.submission.failure;
  protected readonly fieldMessage = fieldMessage;

  protected confirm(): void {
    this.submission.submit((request) => this.api.confirmEnrolment(request), (confirmation) => this.confirmed.emit(confirmation));
  }

  protected cancel(): void {
    this.cancelled.emit();
  }
}

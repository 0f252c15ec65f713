import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router } from '@angular/router';
import {
  ROLE_LABELS,
  type EnrolmentConfirmation,
  type RecoveryCodesResponse,
  type SecondFactorEnrolment,
  type SecondFactorStatus,
  type SessionResponse,
} from '@tidemark/shared';
import type { Observable } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { homePathFor } from '../../../core/shell/navigation';
import { AccountSecurityApi } from '../account-security-api';
import { CodePromptDialog, type CodePromptData } from '../code-prompt-dialog/code-prompt-dialog';
import { EnrolmentPanel } from '../enrolment-panel/enrolment-panel';
import { PasswordPanel } from '../password-panel/password-panel';
import { RecoveryCodesPanel } from '../recovery-codes-panel/recovery-codes-panel';
import { SessionsPanel } from '../sessions-panel/sessions-panel';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/**
 * Sign-in protection: whether one-time codes are on, setting them up (QR code, key, first
 * code), recovery codes shown once, new recovery codes, switching codes off, changing one's own
 * password and seeing or ending one's own sessions (the last two not while codes must first be
 * set up: the server lets nothing else through).
 */
@Component({
  selector: 'tm-security-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, EnrolmentPanel, PasswordPanel, RecoveryCodesPanel, SessionsPanel],
  templateUrl: './security-page.html',
  styleUrls: ['../account-panel.scss', './security-page.scss'],
})
export class SecurityPage {
  private readonly api = inject(AccountSecurityApi);
  private readonly session = inject(AuthSession);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly status = signal<SecondFactorStatus | null>(null);
  protected readonly enrolment = signal<SecondFactorEnrolment | null>(null);
  /** Recovery codes just issued; shown until the person says they are kept. */
  protected readonly recoveryCodes = signal<readonly string[] | null>(null);
  protected readonly isBusy = signal(false);
  protected readonly outcome = signal<string | null>(null);

  /** The role must set up codes before anything else opens. */
  protected readonly isEnrolmentRequired = computed(() => this.session.secondFactor() === 'enrolment-required');
  protected readonly roleLabel = computed(() => {
    const user = this.session.user();
    return user ? ROLE_LABELS[user.role] : '';
  });
  /** Set when codes were switched on from the enrolment-required state: the app opens after the codes are kept. */
  private readonly isContinuingToApp = signal(false);

  constructor() {
    this.loadStatus();
  }

  protected startEnrolment(): void {
    this.isBusy.set(true);
    this.outcome.set(null);
    this.api
      .startEnrolment()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (enrolment) => {
          this.isBusy.set(false);
          this.enrolment.set(enrolment);
        },
        // The error notice says what went wrong; the button is usable again.
        error: () => this.isBusy.set(false),
      });
  }

  protected enrolmentConfirmed(confirmation: EnrolmentConfirmation): void {
    this.isContinuingToApp.set(this.isEnrolmentRequired());
    this.session.apply(confirmation.session);
    this.enrolment.set(null);
    this.recoveryCodes.set(confirmation.recoveryCodes);
    this.loadStatus();
  }

  protected cancelEnrolment(): void {
    this.enrolment.set(null);
  }

  protected codesKept(): void {
    this.recoveryCodes.set(null);
    const user = this.session.user();
    if (this.isContinuingToApp() && user) {
      void this.router.navigateByUrl(homePathFor(user.role));
    }
  }

  protected regenerateRecoveryCodes(): void {
    this.askForCode<RecoveryCodesResponse>({
      title: 'Make new recovery codes',
      paragraphs: ['Your current recovery codes stop working and ten new ones are shown once.', 'Enter the code your app shows now.'],
      actionLabel: 'Make new codes',
      submit: (request) => this.api.regenerateRecoveryCodes(request),
    }).subscribe((answer) => {
      if (answer) {
        this.recoveryCodes.set(answer.recoveryCodes);
        this.loadStatus();
      }
    });
  }

  protected disable(): void {
    this.askForCode<SessionResponse>({
      title: 'Switch off one-time codes',
      paragraphs: [
        'Signing in will need your password only, and your recovery codes stop working.',
        'Enter the code your app shows now. You can then remove Tidemark from the app.',
      ],
      actionLabel: 'Switch off',
      submit: (request) => this.api.disable(request),
    }).subscribe((answer) => {
      if (answer) {
        this.session.apply(answer);
        this.outcome.set('One-time codes are off.');
        this.loadStatus();
      }
    });
  }

  private askForCode<T>(data: CodePromptData<T>): Observable<T | undefined> {
    return this.dialog
      .open<CodePromptDialog<T>, CodePromptData<T>, T>(CodePromptDialog, { data, autoFocus: 'first-tabbable', maxWidth: '520px' })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef));
  }

  private loadStatus(): void {
    this.api
      .status()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((status) => this.status.set(status));
  }
}

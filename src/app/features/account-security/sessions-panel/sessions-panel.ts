import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { OwnSession } from '@tidemark/shared';
import type { Observable } from 'rxjs';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';
import { AccountSecurityApi } from '../account-security-api';

/** The outcome of ending the other sessions, in one sentence. */
export function endedOthersSentence(endedSessions: number): string {
  if (endedSessions === 0) return 'There were no other sessions to end.';
  return `Signed out of ${endedSessions} other ${endedSessions === 1 ? 'session' : 'sessions'}.`;
}

/**
 * Where the person is signed in: each live session with its browser, sign-in time and last
 * activity, this one marked; ending one, or all but this one (OWASP ASVS 5.0 §7.5.2).
 */
@Component({
  selector: 'tm-sessions-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './sessions-panel.html',
  styleUrls: ['../account-panel.scss', './sessions-panel.scss'],
})
export class SessionsPanel {
  private readonly api = inject(AccountSecurityApi);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly sessions = signal<readonly OwnSession[] | null>(null);
  protected readonly isBusy = signal(false);
  protected readonly outcome = signal<string | null>(null);

  constructor() {
    this.reload();
  }

  /** Reads the list again (after a password change has ended the other sessions, say). */
  reload(): void {
    this.api
      .sessions()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((sessions) => this.sessions.set(sessions));
  }

  protected hasOthers(sessions: readonly OwnSession[]): boolean {
    return sessions.some((session) => !session.isCurrent);
  }

  protected end(session: OwnSession): void {
    this.run(() => this.api.endSession(session.id), () => `Ended the session of ${session.device}.`);
  }

  protected endOthers(): void {
    this.run(() => this.api.endOtherSessions(), (result) => endedOthersSentence(result?.endedSessions ?? 0));
  }

  private run<T>(call: () => Observable<T>, sentence: (result: T) => string): void {
    if (this.isBusy()) return;
    this.isBusy.set(true);
    this.outcome.set(null);
    call()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (result) => {
          this.isBusy.set(false);
          this.outcome.set(sentence(result));
          this.reload();
        },
        // The error notice says why; the list is read again, as the session may have ended meanwhile.
        error: () => {
          this.isBusy.set(false);
          this.reload();
        },
      });
  }
}

import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { filter, switchMap, tap } from 'rxjs';
import { ConfirmDialog, ConfirmDialogData } from '../../../shared/confirm-dialog/confirm-dialog';
import { failureSentence } from '../../../shared/failure-sentence/failure-sentence';
import { ReportScope, scopeWords } from '../report-scope';
import { ReportsApi } from '../reports-api';

/** The sentence after the notice went out; an empty committee is said plainly. */
export function noticeOutcome(queued: number): string {
  if (queued === 0) {
    return 'Nobody was written to: there is no active governance committee member. An administrator can add one under Team.';
  }
  return `Sent to ${queued} committee ${queued === 1 ? 'member' : 'members'}.`;
}

/**
 * "Tell the committee" (audit lead only): after a confirmation, e-mails every active
 * governance member that the pack is ready. The mail is a sign-in link, never patient data.
 */
@Component({
  selector: 'tm-committee-notice',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './committee-notice.html',
  styleUrl: './committee-notice.scss',
})
export class CommitteeNotice {
  private readonly api = inject(ReportsApi);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);

  /** The audit and scope the committee is told about. */
  readonly scope = input.required<ReportScope>();

  protected readonly scopeWords = computed(() => scopeWords(this.scope()));
  protected readonly isSending = signal(false);
  protected readonly outcome = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);

  constructor() {
    // The last result speaks of the previous scope; clear it when the choice changes.
    effect(() => {
      this.scope();
      untracked(() => {
        this.outcome.set(null);
        this.failure.set(null);
      });
    });
  }

  protected confirmNotice(): void {
    const scope = this.scope();
    const data: ConfirmDialogData = {
      title: 'Tell the committee?',
      icon: 'forward_to_inbox',
      paragraphs: [
        `Every active member of the governance committee gets an e-mail saying the pack for “${scope.audit.title}” (${scopeWords(scope)}) is ready.`,
        'The e-mail carries a sign-in link to Reports and no patient data: no patient codes, measurements, dates or notes. Members download the de-identified workbook after signing in.',
      ],
      confirmLabel: 'Send the e-mail',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((confirmed) => confirmed === true),
        tap(() => {
          this.isSending.set(true);
          this.outcome.set(null);
          this.failure.set(null);
        }),
        switchMap(() => this.api.sendPack(scope.audit.id, scope.cycle?.id ?? null)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: ({ queued }) => {
          this.isSending.set(false);
          this.outcome.set(noticeOutcome(queued));
        },
        error: (error: unknown) => {
          this.isSending.set(false);
          this.failure.set(failureSentence(error, 'The e-mail could not be sent. Try again.'));
        },
      });
  }
}

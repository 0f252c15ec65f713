import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { AuditView, OperatorView } from '@tidemark/shared';
import { AuthSession } from '../../../core/auth/auth-session';
import { AuditsApi } from '../audits-api';
import { CycleStageBadge } from '../badges/cycle-stage-badge';
import { cohortSentence, describeCohort } from '../cohort-description';
import { operatorNamingFor } from '../operator-naming';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** One audit as its card shows it. */
interface AuditCard {
  readonly audit: AuditView;
  readonly cohort: string;
  readonly latestCycle: AuditView['cycles'][number] | null;
}

/** Audits: every audit of the practice as a card, newest first; the audit lead can start a new one. */
@Component({
  selector: 'tm-audit-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CycleStageBadge, LocalDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './audit-list.html',
  styleUrl: './audit-list.scss',
})
export class AuditList {
  private readonly api = inject(AuditsApi);
  private readonly locale = inject(LOCALE_ID);
  private readonly user = inject(AuthSession).user;

  protected readonly isLead = computed(() => this.user()?.role === 'audit_lead');
  protected readonly audits = signal<AuditView[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  private readonly operators = signal<OperatorView[]>([]);

  protected readonly cards = computed<AuditCard[]>(() => {
    const naming = operatorNamingFor(this.user(), this.operators());
    return this.audits().map((audit) => ({
      audit,
      cohort: cohortSentence(describeCohort(audit.cohort, naming, this.locale)),
      latestCycle: audit.cycles.at(-1) ?? null,
    }));
  });

  constructor() {
    const role = this.user()?.role;
    // Names of operators only for those who may see them; others read counts (see operatorNamingFor).
    if (role === 'audit_lead' || role === 'partner') {
      this.api
        .operators()
        .pipe(takeUntilDestroyed())
        .subscribe({ next: (operators) => this.operators.set(operators), error: () => this.operators.set([]) });
    }
    this.loadAudits();
  }

  protected loadAudits(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.api.list().subscribe({
      next: (audits) => {
        this.audits.set(audits);
        this.isLoading.set(false);
      },
      error: () => {
        // The global notice has said why; the page offers a retry.
        this.isLoading.set(false);
        this.hasLoadFailed.set(true);
      },
    });
  }
}

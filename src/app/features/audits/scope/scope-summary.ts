import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { AuditView, CohortPreview, OperatorView } from '@tidemark/shared';
import { AuthSession } from '../../../core/auth/auth-session';
import { MillimetresPipe } from '../../../shared/millimetres/millimetres-pipe';
import { describeCohort } from '../cohort-description';
import { operatorNamingFor } from '../operator-naming';
import { intervalWords } from '../standard-wording';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** An audit's scope for those who read it: aims, schedule, thresholds and the cohort in words. */
@Component({
  selector: 'tm-scope-summary',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [LocalDatePipe, MatIconModule, MillimetresPipe],
  templateUrl: './scope-summary.html',
  styleUrl: './scope-summary.scss',
})
export class ScopeSummary {
  private readonly locale = inject(LOCALE_ID);
  private readonly user = inject(AuthSession).user;

  /** The audit shown. */
  readonly audit = input.required<AuditView>();
  /** Operators known to the reader (names only for the lead and partners). */
  readonly operators = input<readonly OperatorView[]>([]);
  /** The cohort's size from the latest results, when known. */
  readonly cohortCount = input<CohortPreview | null>(null);

  protected readonly clauses = computed(() => describeCohort(this.audit().cohort, operatorNamingFor(this.user(), this.operators()), this.locale));
  protected readonly intervalWords = intervalWords;
}

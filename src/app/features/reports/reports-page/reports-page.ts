import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { CYCLE_STATE_LABELS, type AuditView, type CycleView } from '@tidemark/shared';
import { AuthSession } from '../../../core/auth/auth-session';
import { CommitteeNotice } from '../committee-notice/committee-notice';
import { resolveReportsLink } from '../report-link';
import { ReportScope, isFrozen } from '../report-scope';
import { ReportsApi } from '../reports-api';
import { WorkbookBuilder } from '../workbook-builder/workbook-builder';
import { WorkbookContents } from '../workbook-contents/workbook-contents';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** The scope picker's value: live results, or a cycle's id. */
type ScopeChoice = 'live' | number;

interface ReportChoiceForm {
  auditId: FormControl<number | null>;
  scope: FormControl<ScopeChoice>;
}

/** Where a scope's numbers come from, in an icon and a sentence. */
interface ScopeNote {
  readonly icon: string;
  readonly text: string;
}

/** The scope a newly chosen audit starts on: its latest frozen cycle, else live results. */
export function defaultScope(audit: AuditView | undefined): ScopeChoice {
  const frozen = (audit?.cycles ?? []).filter(isFrozen).sort((a, b) => b.number - a.number);
  return frozen[0]?.id ?? 'live';
}

/** Reports: choose an audit and scope, build the governance workbook, and (lead) tell the committee. */
@Component({
  selector: 'tm-reports-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CommitteeNotice,
    LocalDatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
    WorkbookBuilder,
    WorkbookContents,
  ],
  templateUrl: './reports-page.html',
  styleUrl: './reports-page.scss',
})
export class ReportsPage {
  private readonly api = inject(ReportsApi);
  private readonly destroyRef = inject(DestroyRef);

  /** `?audit=` of a link into Reports (the "governance pack ready" e-mail's): the audit to open on. */
  readonly linkedAudit = input<string | undefined>(undefined, { alias: 'audit' });
  /** `?cycle=` of such a link: a cycle id, or "live". */
  readonly linkedCycle = input<string | undefined>(undefined, { alias: 'cycle' });

  /** Only the audit lead tells the committee and imports past cases (DESIGN.md §2). */
  protected readonly isLead = inject(AuthSession).user()?.role === 'audit_lead';
  protected readonly stageLabels = CYCLE_STATE_LABELS;
  protected readonly isFrozen = isFrozen;

  protected readonly audits = signal<readonly AuditView[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  /** The link named an audit or cycle that is not (or no longer) there for this person. */
  protected readonly isLinkMissing = signal(false);
  private isLinkApplied = false;

  protected readonly form = new FormGroup<ReportChoiceForm>({
    auditId: new FormControl<number | null>(null),
    scope: new FormControl<ScopeChoice>('live', { nonNullable: true }),
  });
  private readonly choice = toSignal(this.form.valueChanges, { initialValue: this.form.getRawValue() });

  protected readonly audit = computed(() => this.audits().find((audit) => audit.id === this.choice().auditId));
  protected readonly cycle = computed<CycleView | null>(() => {
    const scope = this.choice().scope;
    return scope === 'live' || scope === undefined ? null : (this.audit()?.cycles.find((cycle) => cycle.id === scope) ?? null);
  });
  protected readonly scope = computed<ReportScope | null>(() => {
    const audit = this.audit();
    return audit ? { audit, cycle: this.cycle() } : null;
  });
  protected readonly scopeNote = computed<ScopeNote>(() => {
    const cycle = this.cycle();
    if (!cycle) {
      return { icon: 'autorenew', text: 'Live: recomputed from today’s records, so figures can change as recalls are entered.' };
    }
    return isFrozen(cycle)
      ? { icon: 'lock', text: 'Frozen when the cycle was reported: the workbook shows the results exactly as presented.' }
      : { icon: 'pending', text: 'Not frozen yet: this cycle’s period, computed from today’s records.' };
  });

  constructor() {
    this.form.controls.auditId.valueChanges.pipe(takeUntilDestroyed()).subscribe((auditId) => {
      this.form.controls.scope.setValue(defaultScope(this.audits().find((audit) => audit.id === auditId)));
    });
    this.loadAudits();
  }

  protected loadAudits(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.api
      .audits()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (audits) => {
          this.audits.set(audits);
          this.isLoading.set(false);
          if (!this.isLinkApplied) this.applyLink(audits);
          if (!audits.some((audit) => audit.id === this.form.controls.auditId.value)) {
            this.form.controls.auditId.setValue(audits[0]?.id ?? null);
          }
        },
        // The error notice has said why; the page offers a retry.
        error: () => {
          this.isLoading.set(false);
          this.hasLoadFailed.set(true);
        },
      });
  }

  /** Opens on the audit and scope a link asked for, once; later choices are the person's own. */
  private applyLink(audits: readonly AuditView[]): void {
    this.isLinkApplied = true;
    const linked = resolveReportsLink(audits, this.linkedAudit(), this.linkedCycle());
    this.isLinkMissing.set(linked.kind === 'missing');
    if (linked.kind !== 'found') return;
    this.form.controls.auditId.setValue(linked.auditId);
    this.form.controls.scope.setValue(linked.scope);
  }
}

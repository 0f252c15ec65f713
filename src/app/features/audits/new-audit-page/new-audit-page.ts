import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { AuditView, OperatorView } from '@tidemark/shared';
import { AuthSession } from '../../../core/auth/auth-session';
import { AuditsApi } from '../audits-api';
import { ScopeEditor } from '../scope/scope-editor';

/** Defining a new audit (audit lead): its scope first; standards and cycles follow on the audit page. */
@Component({
  selector: 'tm-new-audit-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, RouterLink, ScopeEditor],
  template: `
    <a mat-button routerLink="/audits" class="back">
      <mat-icon aria-hidden="true">arrow_back</mat-icon>
      All audits
    </a>
    <header>
      <h1>New audit</h1>
      <p class="lead">Say what the audit looks at and which cases it takes in. Its standards come next.</p>
    </header>
    <tm-scope-editor [leadName]="leadName()" [operators]="operators()" (saved)="openAudit($event)" />
  `,
  styles: `
    :host {
      display: block;
      max-width: 1280px;
    }
    .back {
      margin: 0 0 8px -12px;
      min-height: 48px;
    }
    h1 {
      margin: 0;
      font: var(--mat-sys-headline-medium);
      font-weight: 600;
    }
    .lead {
      margin: 4px 0 24px;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class NewAuditPage {
  private readonly api = inject(AuditsApi);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly user = inject(AuthSession).user;

  protected readonly operators = signal<OperatorView[]>([]);
  protected readonly leadName = computed(() => `${this.user()?.displayName ?? 'you'} (you)`);

  constructor() {
    this.api
      .operators()
      .pipe(takeUntilDestroyed())
      .subscribe({ next: (operators) => this.operators.set(operators), error: () => this.operators.set([]) });
  }

  protected openAudit(audit: AuditView): void {
    this.snackBar.open('The audit was created. Add the standards it should meet.', 'OK', { duration: 6000 });
    void this.router.navigate(['/audits', audit.id], { queryParams: { area: 'criteria' } });
  }
}

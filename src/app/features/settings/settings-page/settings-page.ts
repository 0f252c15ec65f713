import { ChangeDetectionStrategy, Component, DestroyRef, LOCALE_ID, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { SystemOverview } from '@tidemark/shared';
import { BackupsPanel } from '../backups-panel/backups-panel';
import { formatByteSize } from '../byte-size';
import { mailSummary, photoStorageSummary, schemaSummary, secondFactorRule, sessionLimitsRule } from '../installation-wording';
import { SettingsApi } from '../settings-api';

/**
 * Settings (administrator): a read-only account of how this installation keeps its records,
 * photographs and mail, its sign-in rules, and its backups with "take a backup now". The
 * values come from the server's environment; the page says so rather than offering edits.
 */
@Component({
  selector: 'tm-settings-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BackupsPanel, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './settings-page.html',
  styleUrl: './settings-page.scss',
})
export class SettingsPage {
  private readonly settingsApi = inject(SettingsApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly locale = inject(LOCALE_ID);

  protected readonly overview = signal<SystemOverview | null>(null);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);

  protected readonly schemaWords = computed(() => {
    const current = this.overview();
    return current ? schemaSummary(current.schema) : '';
  });
  protected readonly photoWords = computed(() => {
    const current = this.overview();
    return current ? photoStorageSummary(current.photoStorage) : '';
  });
  protected readonly mailWords = computed(() => {
    const current = this.overview();
    return current ? mailSummary(current.mail) : '';
  });
  protected readonly secondFactorWords = computed(() => {
    const current = this.overview();
    return current ? secondFactorRule(current.signIn) : '';
  });
  protected readonly sessionWords = computed(() => {
    const current = this.overview();
    return current ? sessionLimitsRule(current.signIn) : '';
  });

  constructor() {
    this.loadOverview();
  }

  protected loadOverview(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.settingsApi
      .systemOverview()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (overview) => {
          this.overview.set(overview);
          this.isLoading.set(false);
        },
        // The error notice has said why; the page offers a retry. A refresh keeps what was shown.
        error: () => {
          this.isLoading.set(false);
          this.hasLoadFailed.set(this.overview() === null);
        },
      });
  }

  protected size(bytes: number): string {
    return formatByteSize(bytes, this.locale);
  }
}

import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/**
 * A determinate bar for a server job (or an upload) with its percentage in words beside it,
 * so the state is read, not guessed from a length of colour.
 */
@Component({
  selector: 'tm-job-progress',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatProgressBarModule],
  template: `
    <mat-progress-bar mode="determinate" [value]="percent()" [attr.aria-label]="label()" />
    <p class="words" aria-live="polite">
      <span>{{ label() }}</span>
      <span class="percent">{{ percent() }} %</span>
    </p>
  `,
  styles: `
    :host {
      display: block;
    }
    mat-progress-bar {
      --mat-progress-bar-track-height: 8px;
      --mat-progress-bar-active-indicator-height: 8px;
      border-radius: var(--mat-sys-corner-full);
    }
    .words {
      display: flex;
      justify-content: space-between;
      gap: 12px;
      margin: 6px 0 0;
      font: var(--mat-sys-body-medium);
    }
    .percent {
      font-variant-numeric: tabular-nums;
      font-weight: 500;
    }
  `,
})
export class JobProgress {
  /** Share done, 0–1 (values outside are clamped). */
  readonly fraction = input.required<number>();
  /** What is happening, e.g. "Building the workbook". */
  readonly label = input.required<string>();

  protected readonly percent = computed(() => Math.round(100 * Math.min(1, Math.max(0, this.fraction()))));
}

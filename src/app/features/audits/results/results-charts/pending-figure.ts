import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Loaded } from '../results-load';

/** Stands in for a chart whose data is still loading or failed to load, under the chart's own title. */
@Component({
  selector: 'tm-pending-figure',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <section class="pending" [attr.aria-busy]="loaded().status === 'loading'">
      <h3>{{ heading() }}</h3>
      @if (loaded().status === 'failed') {
        <p class="failure"><mat-icon aria-hidden="true">error</mat-icon>{{ loaded().failure }}</p>
        <button mat-stroked-button type="button" (click)="retry.emit()">Try again</button>
      } @else {
        <p>Working out this chart…</p>
        <mat-progress-bar mode="indeterminate" [attr.aria-label]="'Loading ' + heading()" />
      }
    </section>
  `,
  styles: `
    .pending {
      padding: 20px;
      border: 1px dashed var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      color: var(--mat-sys-on-surface-variant);
    }
    h3 {
      margin: 0 0 8px;
      font: var(--mat-sys-title-large);
      color: var(--mat-sys-on-surface);
    }
    .failure {
      display: flex;
      gap: 8px;
      align-items: center;
    }
  `,
})
export class PendingFigure {
  /** The chart's title. */
  readonly heading = input.required<string>();
  readonly loaded = input.required<Loaded<unknown>>();
  readonly retry = output<void>();
}

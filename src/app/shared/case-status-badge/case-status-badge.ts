import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { CASE_STATUS_LABELS, type CaseStatus } from '@tidemark/shared';

/** Material Symbols ligature for each case state; the word always goes with it. */
export const CASE_STATUS_ICONS: Readonly<Record<CaseStatus, string>> = {
  planned: 'edit_calendar',
  operated: 'healing',
  'in-recall': 'event_repeat',
  concluded: 'task_alt',
  withdrawn: 'block',
};

/** A case's life-cycle state as an icon and a word, never colour alone. */
@Component({
  selector: 'tm-case-status-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <mat-icon aria-hidden="true">{{ icon() }}</mat-icon>
    <span>{{ label() }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      padding: 4px 12px 4px 8px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-large);
      white-space: nowrap;
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host(.quiet) {
      background: transparent;
      color: var(--mat-sys-on-surface-variant);
      box-shadow: inset 0 0 0 1px var(--mat-sys-outline);
    }
    mat-icon {
      width: 20px;
      height: 20px;
      font-size: 20px;
    }
  `,
  host: { '[class.quiet]': "status() === 'withdrawn' || status() === 'concluded'" },
})
export class CaseStatusBadge {
  /** The case's state. */
  readonly status = input.required<CaseStatus>();

  protected readonly icon = computed(() => CASE_STATUS_ICONS[this.status()]);
  protected readonly label = computed(() => CASE_STATUS_LABELS[this.status()]);
}

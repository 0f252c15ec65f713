import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** A member's account state as an icon and a word, never colour alone. */
@Component({
  selector: 'tm-member-status',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <mat-icon aria-hidden="true">{{ isActive() ? 'check_circle' : 'do_not_disturb_on' }}</mat-icon>
    <span>{{ isActive() ? 'Active' : 'Inactive' }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      padding: 4px 12px 4px 8px;
      border-radius: var(--mat-sys-corner-full);
      font: var(--mat-sys-label-large);
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    :host(.inactive) {
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
  host: { '[class.inactive]': '!isActive()' },
})
export class MemberStatus {
  /** Whether the account may sign in. */
  readonly isActive = input.required<boolean>();
}

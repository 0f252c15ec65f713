import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Whether a member signs in with one-time codes as well as a password: an icon and words, never colour alone. */
@Component({
  selector: 'tm-member-protection',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <mat-icon aria-hidden="true">{{ isEnabled() ? 'verified_user' : 'key' }}</mat-icon>
    <span>{{ isEnabled() ? 'Codes on' : 'Password only' }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      font: var(--mat-sys-label-large);
      color: var(--mat-sys-on-surface-variant);
    }
    :host(.enabled) {
      color: var(--mat-sys-on-surface);
    }
    mat-icon {
      width: 20px;
      height: 20px;
      font-size: 20px;
    }
  `,
  host: { '[class.enabled]': 'isEnabled()' },
})
export class MemberProtection {
  /** One-time codes are switched on for the member. */
  readonly isEnabled = input.required<boolean>();
}

import { ChangeDetectionStrategy, Component, input, model } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/**
 * The eye button that shows or hides what a password field holds (OWASP ASVS 5.0 §6.2.6 allows
 * showing on request). Place it in the field with `matSuffix` and bind `[(shown)]` to the signal
 * that sets the input's type.
 */
@Component({
  selector: 'tm-visibility-toggle',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button
      mat-icon-button
      type="button"
      (click)="shown.set(!shown())"
      [attr.aria-label]="(shown() ? 'Hide ' : 'Show ') + what()"
      [attr.aria-pressed]="shown()"
    >
      <mat-icon aria-hidden="true">{{ shown() ? 'visibility_off' : 'visibility' }}</mat-icon>
    </button>
  `,
  styles: ':host { display: inline-flex; }',
})
export class VisibilityToggle {
  /** Whether the field shows its text. */
  readonly shown = model(false);
  /** What the button's name says it shows ("password", "passwords"). */
  readonly what = input('password');
}

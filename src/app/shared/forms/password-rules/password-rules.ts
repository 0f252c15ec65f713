import { ChangeDetectionStrategy, Component } from '@angular/core';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@tidemark/shared';

/**
 * The rules a new password meets, in the words of `shared/schemas/user.ts` (length) and the
 * server's common-password and context-word checks (server/auth/common-passwords.ts,
 * server/auth/context-words.ts). Give the host an `id` and point the field's
 * `aria-describedby` at it.
 */
@Component({
  selector: 'tm-password-rules',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <ul class="rules">
      <li>At least {{ minLength }} characters, at most {{ maxLength }}. A few unrelated words make a strong one.</li>
      <li>Passwords on a list of commonly used ones are refused.</li>
      <li>So are passwords made only of words anyone would try here: Tidemark, the trade’s words, the person’s name.</li>
    </ul>
  `,
  styles: `
    :host {
      display: block;
    }
    .rules {
      margin: 0;
      padding-left: 20px;
      max-width: 52ch;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-medium);
    }
  `,
})
export class PasswordRules {
  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly maxLength = PASSWORD_MAX_LENGTH;
}

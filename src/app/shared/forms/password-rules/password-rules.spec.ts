import { TestBed } from '@angular/core/testing';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@tidemark/shared';
import { PasswordRules } from './password-rules';

describe('PasswordRules', () => {
  it('states the length limits of the shared schema and both server checks, one rule per item', async () => {
    const fixture = TestBed.createComponent(PasswordRules);
    await fixture.whenStable();
    const items = [...(fixture.nativeElement as HTMLElement).querySelectorAll('li')].map((item) => item.textContent?.trim());
    expect(items).toEqual([
      `At least ${PASSWORD_MIN_LENGTH} characters, at most ${PASSWORD_MAX_LENGTH}. A few unrelated words make a strong one.`,
      'Passwords on a list of commonly used ones are refused.',
      'So are passwords made only of words anyone would try here: Tidemark, the trade’s words, the person’s name.',
    ]);
  });
});

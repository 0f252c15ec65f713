import { FormControl } from '@angular/forms';
import { z } from 'zod';
import { requiredZodValidator } from './required-zod-validator';
import { fieldMessage } from './zod-validator';

describe('requiredZodValidator', () => {
  const millimetres = z.number().max(20, 'Must be 20 mm or less.');

  it('says our own sentence when nothing was entered', () => {
    const control = new FormControl<number | null>(null, { validators: requiredZodValidator(millimetres, 'Enter REF→GM.') });
    expect(fieldMessage(control)).toBe('Enter REF→GM.');
    const text = new FormControl('  ', { nonNullable: true, validators: requiredZodValidator(z.string(), 'Enter a reason.') });
    expect(fieldMessage(text)).toBe('Enter a reason.');
  });

  it("otherwise keeps the schema's message", () => {
    const control = new FormControl<number | null>(20.5, { validators: requiredZodValidator(millimetres, 'Enter REF→GM.') });
    expect(fieldMessage(control)).toBe('Must be 20 mm or less.');
    control.setValue(0);
    expect(control.valid).toBe(true);
  });
});

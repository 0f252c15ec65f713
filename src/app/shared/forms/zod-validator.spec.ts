import { FormControl } from '@angular/forms';
import { z } from 'zod';
import { SERVER_ERROR, fieldMessage, zodValidator } from './zod-validator';

describe('zodValidator', () => {
  const schema = z.string().min(3, 'Too short.').email('Not an e-mail.');

  it('keeps the first issue message of the schema', () => {
    const control = new FormControl('ab', { nonNullable: true, validators: zodValidator(schema) });
    expect(fieldMessage(control)).toBe('Too short.');
    control.setValue('abcd');
    expect(fieldMessage(control)).toBe('Not an e-mail.');
    control.setValue('a@b.org');
    expect(control.valid).toBe(true);
    expect(fieldMessage(control)).toBeNull();
  });

  it('prefers a server message over the schema message', () => {
    const control = new FormControl('ab', { nonNullable: true, validators: zodValidator(schema) });
    control.setErrors({ ...control.errors, [SERVER_ERROR]: 'Already in use.' });
    expect(fieldMessage(control)).toBe('Already in use.');
  });
});

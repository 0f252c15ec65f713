import { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type { ZodType } from 'zod';
import { SCHEMA_ERROR, zodValidator } from './zod-validator';

/**
 * Like `zodValidator`, with our own sentence for an empty entry: a schema's message for a
 * missing number is zod's generic "expected number, received null", which no one at the
 * chair should have to read.
 *
 * @param schema the shared schema of the field
 * @param emptyMessage what to say when nothing was entered
 */
export function requiredZodValidator(schema: ZodType, emptyMessage: string): ValidatorFn {
  const validate = zodValidator(schema);
  return (control: AbstractControl): ValidationErrors | null => {
    const value: unknown = control.value;
    if (value === null || value === undefined || (typeof value === 'string' && value.trim() === '')) {
      return { [SCHEMA_ERROR]: emptyMessage };
    }
    return validate(control);
  };
}

import { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type { ZodType } from 'zod';

/** Error key under which a schema's message is stored on a control. */
export const SCHEMA_ERROR = 'schema';

/** Error key for a message the server returned for a field. */
export const SERVER_ERROR = 'server';

/**
 * Validates a control with a zod schema from `@tidemark/shared`, so the form and the
 * server enforce the same rule and say it in the same words. The first issue's
 * message is kept under `schema`.
 */
export function zodValidator(schema: ZodType): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const result = schema.safeParse(control.value);
    return result.success ? null : { [SCHEMA_ERROR]: result.error.issues[0]?.message ?? 'Check this entry.' };
  };
}

/** The message to show under a field: the server's, else the schema's, else nothing. */
export function fieldMessage(control: AbstractControl): string | null {
  const errors = control.errors;
  if (!errors) {
    return null;
  }
  const message: unknown = errors[SERVER_ERROR] ?? errors[SCHEMA_ERROR];
  return typeof message === 'string' ? message : null;
}

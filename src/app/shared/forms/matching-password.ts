import { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { SCHEMA_ERROR } from './zod-validator';

/** Said when the second entry of a new password differs from the first. */
export const PASSWORDS_DIFFER = 'The two entries differ. Type the same password twice.';

/**
 * Validator for a "type it again" field: its value must equal the sibling control named
 * `passwordControl` (empty is left to the form's own "type it twice" check at submit).
 * Re-run it when the first field changes, as its value is read from there.
 */
export function matchesPassword(passwordControl: string): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const password: unknown = control.parent?.get(passwordControl)?.value;
    return control.value === '' || control.value === password ? null : { [SCHEMA_ERROR]: PASSWORDS_DIFFER };
  };
}

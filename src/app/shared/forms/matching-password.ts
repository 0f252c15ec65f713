import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
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

/** Said at submit when the second entry was left empty. */
export const REPEAT_MISSING = 'Type the new password a second time.';

/**
 * Re-runs the repeat field's check whenever the first entry changes. Call it in a constructor
 * (injection context): the subscription ends with the component.
 */
export function recheckRepeatOnChange(password: AbstractControl<string>, repeat: AbstractControl<string>): void {
  password.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => repeat.updateValueAndValidity({ emitEvent: false }));
}

/** At submit, marks an empty repeat field (left alone while typing, so it does not nag). */
export function requireRepeat(repeat: AbstractControl<string>): void {
  if (repeat.value === '') repeat.setErrors({ [SCHEMA_ERROR]: REPEAT_MISSING });
}

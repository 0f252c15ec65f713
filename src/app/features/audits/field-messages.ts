import { AbstractControl, FormArray, FormGroup } from '@angular/forms';
import type { z } from 'zod';

/** Zod issues as `{ "field.path": message }`, first message per field — the shape the server's 400 uses too. */
export function issueMessages(issues: readonly z.core.$ZodIssue[]): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join('.');
    fields[key] ??= issue.message;
  }
  return fields;
}

/**
 * Puts each message under the control at its dotted path (`cohort.surgeryTo`) and marks it
 * touched so it shows. Fields already failing keep their own words. Returns the messages
 * that have no control on this form, for the form to say in its own failure line.
 *
 * @param form the form the paths start from
 * @param fields messages by dotted path
 * @param key the error key, `schema` or `server` (see zod-validator)
 */
export function placeFieldMessages(form: AbstractControl, fields: Readonly<Record<string, string>>, key: string): string[] {
  const unplaced: string[] = [];
  for (const [path, message] of Object.entries(fields)) {
    const control = path ? form.get(path) : null;
    if (!control || control === form) {
      unplaced.push(message);
      continue;
    }
    if (key !== 'server' && control.invalid) continue;
    control.setErrors({ ...control.errors, [key]: message });
    control.markAsTouched();
  }
  return unplaced;
}

/**
 * Runs every control's own validators again, dropping messages placed earlier by
 * `placeFieldMessages` — a rule across fields may have been settled by changing the other field.
 */
export function revalidate(control: AbstractControl): void {
  if (control instanceof FormGroup || control instanceof FormArray) {
    for (const child of Object.values<AbstractControl>(control.controls)) revalidate(child);
  }
  control.updateValueAndValidity({ onlySelf: true });
}

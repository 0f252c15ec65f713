import { Injectable } from '@angular/core';
import { AbstractControl, FormGroupDirective, NgForm } from '@angular/forms';
import { ErrorStateMatcher } from '@angular/material/core';

/**
 * Shows a field's error as soon as something was typed into it (not only after it lost
 * focus), so a reading such as 20.5 mm is questioned while the probe is still in hand.
 * Provide it on a component: `{ provide: ErrorStateMatcher, useClass: LiveErrorStateMatcher }`.
 */
@Injectable()
export class LiveErrorStateMatcher implements ErrorStateMatcher {
  isErrorState(control: AbstractControl | null, form: FormGroupDirective | NgForm | null): boolean {
    return !!control && control.invalid && (control.dirty || control.touched || !!form?.submitted);
  }
}

import { Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { AbstractControl, FormArray, FormGroup } from '@angular/forms';
import { Observable, merge, scan, startWith, switchMap } from 'rxjs';

/**
 * A counter that moves whenever the control or any control inside it emits an event
 * (value, status, touched, pristine). An OnPush view that reads it in a `computed` stays in
 * step with changes made in code elsewhere — `markAllAsTouched()` from the page, errors the
 * server returned — which no DOM event in that view would otherwise announce.
 * Call in an injection context (a field initialiser).
 *
 * @param control the control, usually a component input
 */
export function formRevision(control: Signal<AbstractControl>): Signal<number> {
  return toSignal(
    toObservable(control).pipe(
      switchMap((current) => treeEvents(current)),
      scan((count) => count + 1, 0),
    ),
    { initialValue: 0 },
  );
}

/** Events of a control and its descendants; controls added later are picked up on the next event of the root. */
function treeEvents(root: AbstractControl): Observable<unknown> {
  return root.events.pipe(
    startWith(null),
    switchMap(() => merge(...descendants(root).map((control) => control.events)).pipe(startWith(null))),
  );
}

function descendants(control: AbstractControl): AbstractControl[] {
  if (control instanceof FormGroup || control instanceof FormArray) {
    const children: AbstractControl[] = Object.values(control.controls);
    return children.flatMap((child) => [child, ...descendants(child)]);
  }
  return [];
}

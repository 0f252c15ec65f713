import { InjectionToken } from '@angular/core';
import { EMPTY, Observable, expand, switchMap, timer } from 'rxjs';

/** Pause between two status checks of a server job (an export or an import), in milliseconds. */
export const JOB_POLL_INTERVAL_MS = new InjectionToken<number>('JOB_POLL_INTERVAL_MS', {
  providedIn: 'root',
  factory: () => 800,
});

/**
 * Asks for a job's status at once, then again `intervalMs` after each answer, until
 * `isFinished` says the job has ended; the last (finished) status is emitted too.
 * The next check waits for the previous answer, so a slow server never sees overlapping
 * requests, and an HTTP error ends the stream for the caller to explain.
 */
export function pollUntilFinished<T>(check: () => Observable<T>, isFinished: (status: T) => boolean, intervalMs: number): Observable<T> {
  return check().pipe(expand((status) => (isFinished(status) ? EMPTY : timer(intervalMs).pipe(switchMap(check)))));
}

import { HttpErrorResponse } from '@angular/common/http';
import type { Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { Observable, catchError, filter, map, of, scan, startWith, switchMap } from 'rxjs';
import { describeHttpError } from '../../../core/http/describe-http-error';

/** One view's data: the last answer (kept while a newer one loads, so charts do not jump) and where the request stands. */
export interface Loaded<T> {
  readonly status: 'loading' | 'ready' | 'failed';
  readonly value: T | null;
  /** A sentence saying why loading failed; null otherwise. */
  readonly failure: string | null;
}

const LOADING: Loaded<never> = { status: 'loading', value: null, failure: null };

/**
 * Loads `fetch(key)` whenever `key` changes (a null key waits). A newer key cancels the
 * answer to an older one. Call in an injection context: the subscription ends with it.
 */
export function loadOnChange<K, T>(key: Signal<K | null>, fetch: (key: K) => Observable<T>): Signal<Loaded<T>> {
  const answers = toObservable(key).pipe(
    filter((current): current is K => current !== null),
    switchMap((current) =>
      fetch(current).pipe(
        map((value): Loaded<T> => ({ status: 'ready', value, failure: null })),
        catchError((error: unknown) => of<Loaded<T>>({ status: 'failed', value: null, failure: failureSentence(error) })),
        startWith<Loaded<T>>(LOADING),
      ),
    ),
    // While loading, the previous answer stays on screen; a failure clears it so stale numbers are never mistaken for the new view.
    scan((previous: Loaded<T>, next: Loaded<T>) => (next.status === 'loading' ? { ...next, value: previous.value } : next), LOADING),
  );
  return toSignal(answers, { initialValue: LOADING });
}

/** Same key as before, compared by value (keys are small plain objects). */
export function isSameKey<K>(a: K | null, b: K | null): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

function failureSentence(error: unknown): string {
  return error instanceof HttpErrorResponse ? describeHttpError(error) : 'These results could not be loaded. Try again.';
}

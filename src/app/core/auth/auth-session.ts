import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { LoginRequest, SecondFactorState, SecondFactorVerifyRequest, SessionResponse, SessionUser, SignInOptions } from '@tidemark/shared';
import { Observable, catchError, firstValueFrom, map, of, switchMap, tap, throwError } from 'rxjs';
import { apiErrorDetails } from '../http/api-error-details';
import { showsOwnErrors } from '../http/shows-own-errors';

/** Holds who is signed in, and signs people in and out. */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly currentUser = signal<SessionUser | null>(null);
  private readonly currentSecondFactor = signal<SecondFactorState>('none');

  /** The signed-in person (perhaps still owing a one-time code), or null. */
  readonly user = this.currentUser.asReadonly();

  /** Where the session stands with the second factor (see `SecondFactorState`). */
  readonly secondFactor = this.currentSecondFactor.asReadonly();

  /** Whether someone is signed in with every step done (a pending one-time code keeps the app closed). */
  readonly isSignedIn = computed(() => this.currentUser() !== null && this.currentSecondFactor() !== 'pending');

  /** The password was right and a one-time or recovery code is still due. */
  readonly isAwaitingCode = computed(() => this.currentUser() !== null && this.currentSecondFactor() === 'pending');

  /**
   * Asks the server who is signed in. Runs once before the first screen; it is also
   * the first request, so the server's XSRF cookie exists before any POST.
   */
  async restore(): Promise<void> {
    this.apply(await firstValueFrom(this.fetchCurrentSession()));
  }

  /**
   * Signs in with the password; emits the user, or errors with the server's answer for the
   * form to show. Afterwards `secondFactor()` says whether a code is still due.
   */
  signIn(credentials: LoginRequest): Observable<SessionUser> {
    return this.postLogin(credentials).pipe(
      // The anti-forgery token is bound to the server session; if that session was
      // replaced (e.g. signed out in another tab), fetch a fresh token once and retry.
      catchError((error: unknown) =>
        isCsrfRejection(error)
          ? this.fetchCurrentSession().pipe(switchMap(() => this.postLogin(credentials)))
          : throwError(() => error),
      ),
      tap((response) => this.apply(response)),
      map((response) => response.user),
    );
  }

  /** The second sign-in step: a one-time code or a recovery code; errors go to the form. */
  verifySecondFactor(request: SecondFactorVerifyRequest): Observable<SessionUser> {
    return this.http.post<SessionResponse>('/api/auth/second-factor/verify', request, { context: showsOwnErrors() }).pipe(
      tap((response) => this.apply(response)),
      map((response) => response.user),
    );
  }

  /** What the sign-in page should say before anyone signs in (whether one-time codes are required). */
  signInOptions(): Observable<SignInOptions> {
    return this.http.get<SignInOptions>('/api/auth/sign-in-options', { context: showsOwnErrors() });
  }

  /** Takes over a session answer from another call (switching one-time codes on or off). */
  apply(response: SessionResponse | null): void {
    this.currentUser.set(response?.user ?? null);
    // An answer without the field (an older server) has no second-factor step.
    this.currentSecondFactor.set(response?.secondFactor ?? 'none');
  }

  /** Signs out on the server, then locally; the local session ends even if the server call fails. */
  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', null, { context: showsOwnErrors() }).pipe(
      catchError(() => of(undefined)),
      // The old session's anti-forgery token died with it; ask for a fresh one
      // so the next sign-in from this page is accepted.
      switchMap(() => this.fetchCurrentSession()),
      map(() => undefined),
      tap(() => this.forget()),
    );
  }

  /** Forgets the user locally, e.g. after the server said the session has ended. */
  forget(): void {
    this.apply(null);
  }

  private postLogin(credentials: LoginRequest): Observable<SessionResponse> {
    return this.http.post<SessionResponse>('/api/auth/login', credentials, { context: showsOwnErrors() });
  }

  /** `GET /api/auth/me`; a 401 (or an unreachable server) simply means nobody is signed in. */
  private fetchCurrentSession(): Observable<SessionResponse | null> {
    return this.http.get<SessionResponse>('/api/auth/me', { context: showsOwnErrors() }).pipe(catchError(() => of(null)));
  }
}

function isCsrfRejection(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 403 && apiErrorDetails(error)?.code === 'csrf';
}

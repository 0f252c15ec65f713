import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { LoginRequest, SessionResponse, SessionUser } from '@tidemark/shared';
import { Observable, catchError, firstValueFrom, map, of, switchMap, tap, throwError } from 'rxjs';
import { apiErrorDetails } from '../http/api-error-details';
import { showsOwnErrors } from '../http/shows-own-errors';

/** Holds who is signed in, and signs people in and out. */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly currentUser = signal<SessionUser | null>(null);

  /** The signed-in person, or null. */
  readonly user = this.currentUser.asReadonly();

  /** Whether someone is signed in. */
  readonly isSignedIn = computed(() => this.currentUser() !== null);

  /**
   * Asks the server who is signed in. Runs once before the first screen; it is also
   * the first request, so the server's XSRF cookie exists before any POST.
   */
  async restore(): Promise<void> {
    const user = await firstValueFrom(this.fetchCurrentUser());
    this.currentUser.set(user);
  }

  /** Signs in; emits the user, or errors with the server's answer for the form to show. */
  signIn(credentials: LoginRequest): Observable<SessionUser> {
    return this.postLogin(credentials).pipe(
      // The anti-forgery token is bound to the server session; if that session was
      // replaced (e.g. signed out in another tab), fetch a fresh token once and retry.
      catchError((error: unknown) =>
        isCsrfRejection(error)
          ? this.fetchCurrentUser().pipe(switchMap(() => this.postLogin(credentials)))
          : throwError(() => error),
      ),
      map((response) => response.user),
      tap((user) => this.currentUser.set(user)),
    );
  }

  /** Signs out on the server, then locally; the local session ends even if the server call fails. */
  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', null, { context: showsOwnErrors() }).pipe(
      catchError(() => of(undefined)),
      // The old session's anti-forgery token died with it; ask for a fresh one
      // so the next sign-in from this page is accepted.
      switchMap(() => this.fetchCurrentUser()),
      map(() => undefined),
      tap(() => this.forget()),
    );
  }

  /** Forgets the user locally, e.g. after the server said the session has ended. */
  forget(): void {
    this.currentUser.set(null);
  }

  private postLogin(credentials: LoginRequest): Observable<SessionResponse> {
    return this.http.post<SessionResponse>('/api/auth/login', credentials, { context: showsOwnErrors() });
  }

  /** `GET /api/auth/me`; a 401 (or an unreachable server) simply means nobody is signed in. */
  private fetchCurrentUser(): Observable<SessionUser | null> {
    return this.http.get<SessionResponse>('/api/auth/me', { context: showsOwnErrors() }).pipe(
      map((response) => response.user),
      catchError(() => of(null)),
    );
  }
}

function isCsrfRejection(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 403 && apiErrorDetails(error)?.code === 'csrf';
}

import { Provider, computed, signal } from '@angular/core';
import type { LoginRequest, Role, SessionUser } from '@tidemark/shared';
import { Observable, of } from 'rxjs';
import { AuthSession } from '../auth-session';

/** A person with the given role, for specs. */
export function personWithRole(role: Role): SessionUser {
  return { id: 41, email: `${role}@tidemark.test`, displayName: `Sam ${role}`, role };
}

/** An in-memory stand-in for `AuthSession` in specs: no HTTP, the user set directly. */
export class StubAuthSession implements Pick<AuthSession, 'user' | 'isSignedIn' | 'signIn' | 'signOut' | 'forget'> {
  private readonly current = signal<SessionUser | null>(null);
  readonly user = this.current.asReadonly();
  readonly isSignedIn = computed(() => this.current() !== null);

  constructor(user: SessionUser | null) {
    this.current.set(user);
  }

  signIn(credentials: LoginRequest): Observable<SessionUser> {
    const user = personWithRole('clinician');
    this.current.set({ ...user, email: credentials.email });
    return of(user);
  }

  signOut(): Observable<void> {
    this.current.set(null);
    return of(undefined);
  }

  forget(): void {
    this.current.set(null);
  }
}

/** Provides a `StubAuthSession` signed in as `user` (or signed out for null). */
export function provideStubAuthSession(user: SessionUser | null): Provider[] {
  const stub = new StubAuthSession(user);
  return [
    { provide: StubAuthSession, useValue: stub },
    { provide: AuthSession, useValue: stub },
  ];
}

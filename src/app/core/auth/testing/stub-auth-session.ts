import { Provider, computed, signal } from '@angular/core';
import type { LoginRequest, Role, SecondFactorState, SecondFactorVerifyRequest, SessionResponse, SessionUser, SignInOptions } from '@tidemark/shared';
import { Observable, of } from 'rxjs';
import { AuthSession } from '../auth-session';

/** A person with the given role, for specs. */
export function personWithRole(role: Role): SessionUser {
  return { id: 41, email: `${role}@tidemark.test`, displayName: `Sam ${role}`, role };
}

/** An in-memory stand-in for `AuthSession` in specs: no HTTP, the user set directly. */
export class StubAuthSession
  implements
    Pick<
      AuthSession,
      'user' | 'secondFactor' | 'isSignedIn' | 'isAwaitingCode' | 'signIn' | 'verifySecondFactor' | 'signInOptions' | 'signOut' | 'forget' | 'apply'
    >
{
  private readonly current = signal<SessionUser | null>(null);
  private readonly currentSecondFactor = signal<SecondFactorState>('none');
  readonly user = this.current.asReadonly();
  readonly secondFactor = this.currentSecondFactor.asReadonly();
  readonly isSignedIn = computed(() => this.current() !== null && this.currentSecondFactor() !== 'pending');
  readonly isAwaitingCode = computed(() => this.current() !== null && this.currentSecondFactor() === 'pending');

  constructor(user: SessionUser | null, secondFactor: SecondFactorState = 'none') {
    this.current.set(user);
    this.currentSecondFactor.set(secondFactor);
  }

  apply(response: SessionResponse | null): void {
    this.current.set(response?.user ?? null);
    this.currentSecondFactor.set(response?.secondFactor ?? 'none');
  }

  signIn(credentials: LoginRequest): Observable<SessionUser> {
    const user = personWithRole('clinician');
    this.current.set({ ...user, email: credentials.email });
    return of(user);
  }

  verifySecondFactor(_request: SecondFactorVerifyRequest): Observable<SessionUser> {
    const user = this.current() ?? personWithRole('clinician');
    this.apply({ user, secondFactor: 'verified' });
    return of(user);
  }

  signInOptions(): Observable<SignInOptions> {
    return of({ secondFactorPolicy: 'required' });
  }

  signOut(): Observable<void> {
    this.current.set(null);
    return of(undefined);
  }

  forget(): void {
    this.apply(null);
  }
}

/** Provides a `StubAuthSession` signed in as `user` (or signed out for null), at the given second-factor state. */
export function provideStubAuthSession(user: SessionUser | null, secondFactor: SecondFactorState = 'none'): Provider[] {
  const stub = new StubAuthSession(user, secondFactor);
  return [
    { provide: StubAuthSession, useValue: stub },
    { provide: AuthSession, useValue: stub },
  ];
}

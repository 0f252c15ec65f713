import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { EndedSessions, UserCreateRequest, UserUpdateRequest, UserView } from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

/** HTTP calls of the Team page: `/api/users` (admin only). */
@Injectable({ providedIn: 'root' })
export class TeamApi {
  private readonly http = inject(HttpClient);

  /** Everyone who has an account, active or not. */
  list(): Observable<UserView[]> {
    return this.http.get<UserView[]>('/api/users');
  }

  /**
   * Creates an account. The add-member form shows field errors and conflicts itself,
   * so the global error notice stays out of it.
   */
  create(member: UserCreateRequest): Observable<UserView> {
    return this.http.post<UserView>('/api/users', member, { context: showsOwnErrors() });
  }

  /** Changes name, role, active state or password; a 409 means it would leave no active administrator. */
  update(id: number, changes: UserUpdateRequest): Observable<UserView> {
    return this.http.patch<UserView>(`/api/users/${encodeURIComponent(id)}`, changes);
  }

  /** Changes the name the team sees; the rename dialog shows its own errors. */
  rename(id: number, displayName: string): Observable<UserView> {
    return this.http.patch<UserView>(`/api/users/${encodeURIComponent(id)}`, { displayName }, { context: showsOwnErrors() });
  }

  /**
   * Sets a new password, which ends the member's sessions everywhere. The dialog shows the
   * server's refusals (e.g. a common password) under its field.
   */
  setPassword(id: number, password: string): Observable<UserView> {
    return this.http.patch<UserView>(`/api/users/${encodeURIComponent(id)}`, { password }, { context: showsOwnErrors() });
  }

  /**
   * Removes a member's one-time and recovery codes (a lost phone) and ends their sessions;
   * they set codes up again at their next sign-in if their role requires them. Not for oneself (409).
   */
  resetSecondFactor(id: number): Observable<void> {
    return this.http.delete<void>(`/api/users/${encodeURIComponent(id)}/second-factor`);
  }

  /** Signs a member out on every device (a lost or shared device); password and codes stay. Not for oneself (409). */
  endSessions(id: number): Observable<EndedSessions> {
    return this.http.delete<EndedSessions>(`/api/users/${encodeURIComponent(id)}/sessions`);
  }
}

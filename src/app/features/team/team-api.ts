import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { UserCreateRequest, UserUpdateRequest, UserView } from '@tidemark/shared';
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
}

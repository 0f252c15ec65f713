import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  EndedSessions,
  EnrolmentConfirmation,
  OneTimeCodeRequest,
  OwnSession,
  PasswordChange,
  PasswordChangeResult,
  RecoveryCodesResponse,
  SecondFactorEnrolment,
  SecondFactorStatus,
  SessionResponse,
} from '@tidemark/shared';
import { Observable } from 'rxjs';
import { showsOwnErrors } from '../../core/http/shows-own-errors';

const BASE = '/api/auth/second-factor';

/**
 * HTTP calls of the Sign-in protection page: the signed-in person's own one-time codes.
 * The calls that take a code show their errors beside the code field.
 */
@Injectable({ providedIn: 'root' })
export class AccountSecurityApi {
  private readonly http = inject(HttpClient);

  /** Whether codes are on, how many recovery codes are left, whether the role must use them. */
  status(): Observable<SecondFactorStatus> {
    return this.http.get<SecondFactorStatus>(BASE);
  }

  /** A new secret with its QR code; it works once confirmed. */
  startEnrolment(): Observable<SecondFactorEnrolment> {
    return this.http.post<SecondFactorEnrolment>(`${BASE}/enrolment`, null);
  }

  /** Switches codes on with a code from the new secret; answers the recovery codes (shown once). */
  confirmEnrolment(request: OneTimeCodeRequest): Observable<EnrolmentConfirmation> {
    return this.http.post<EnrolmentConfirmation>(`${BASE}/enrolment/confirm`, request, { context: showsOwnErrors() });
  }

  /** Replaces every recovery code; needs a current code. */
  regenerateRecoveryCodes(request: OneTimeCodeRequest): Observable<RecoveryCodesResponse> {
    return this.http.post<RecoveryCodesResponse>(`${BASE}/recovery-codes`, request, { context: showsOwnErrors() });
  }

  /** Changes the signed-in person's own password; their other sessions end. Errors show beside the fields. */
  changePassword(change: PasswordChange): Observable<PasswordChangeResult> {
    return this.http.post<PasswordChangeResult>('/api/auth/password', change, { context: showsOwnErrors() });
  }

  /** The signed-in person's live sessions, the most recently active first. */
  sessions(): Observable<OwnSession[]> {
    return this.http.get<OwnSession[]>('/api/auth/sessions');
  }

  /** Ends one of the person's other sessions. */
  endSession(id: string): Observable<void> {
    return this.http.delete<void>(`/api/auth/sessions/${encodeURIComponent(id)}`);
  }

  /** Ends every session of the person but this one. */
  endOtherSessions(): Observable<EndedSessions> {
    return this.http.post<EndedSessions>('/api/auth/sessions/end-others', null);
  }

  /** Switches codes off; needs a current code, refused where the role must keep them. */
  disable(request: OneTimeCodeRequest): Observable<SessionResponse> {
    return this.http.post<SessionResponse>(`${BASE}/disable`, request, { context: showsOwnErrors() });
  }
}

import type { Request } from 'express';
import type { ApiErrorCode, Role } from '@tidemark/shared';
import type { SignInRefusal } from '../services/user.service';

/**
 * Security events (OWASP ASVS 5.0 §16.3): one JSON line each, through the request's pino logger,
 * so every line also has `time` (epoch ms, UTC) and `req: { method, path }` (never the query
 * string: request-log.ts). Fields, when they apply:
 *
 * - `event`: the kind below; `msg` the same in words.
 * - `userId`: the signed-in member who made the request (as on request lines).
 * - `accountId`: the account the event is about when that is not the requester (the account a
 *   refused sign-in named, the member an administrator changed).
 * - `emailHash`: a refused sign-in's typed address as a keyed hash (sign-in-address-hash.ts).
 * - `clientAddress`: `req.ip` (the proxy's address unless TRUST_PROXY is set).
 *
 * Never written: passwords, codes, session ids, tokens, cookies, query strings, patient codes,
 * e-mail addresses in clear.
 *
 * Levels: what an investigator looks for first, or what should be rare (a refusal, a limit
 * reached, a recovery code spent), at `warn`; routine successes at `info`. The e2e and bench runs
 * log at `warn`, so only refusals reach their output.
 */
export type SecurityEventKind =
  | 'sign_in.succeeded'
  | 'sign_in.refused'
  | 'sign_in.rate_limited'
  | 'second_factor.accepted'
  | 'second_factor.recovery_code_used'
  | 'second_factor.refused'
  | 'second_factor.rate_limited'
  | 'second_factor.enabled'
  | 'second_factor.disabled'
  | 'second_factor.recovery_codes_renewed'
  | 'second_factor.reset'
  | 'password.changed'
  | 'password.change_refused'
  | 'password.change_rate_limited'
  | 'password.set_by_admin'
  | 'member.created'
  | 'member.access_changed'
  | 'sign_out'
  | 'sessions.ended'
  | 'session.expired'
  | 'access.refused'
  | 'csrf.refused'
  | 'input.refused';

/** How the second step was answered. */
export type CodeMethod = 'one-time-code' | 'recovery-code';

/** Requests that wrote a security event already: the error handler then adds no `access.refused`. */
const withEvent = new WeakSet<Request>();

/** 404 errors that stand for a refusal (a record that is not the member's to know of). */
const hiddenRefusals = new WeakSet<object>();

/**
 * Marks a 404 thrown instead of a 403 so that the record's existence stays hidden (a clinician
 * asking for another operator's case): the answer stays a plain 404, the log says `access.refused`.
 */
export function asHiddenRefusal<T extends object>(error: T): T {
  hiddenRefusals.add(error);
  return error;
}

/** Whether {@link asHiddenRefusal} marked this error. */
export function isHiddenRefusal(error: unknown): boolean {
  return typeof error === 'object' && error !== null && hiddenRefusals.has(error);
}

function write(req: Request, level: 'info' | 'warn', event: SecurityEventKind, msg: string, fields: Record<string, unknown>): void {
  withEvent.add(req);
  req.log?.[level]({ event, ...fields, clientAddress: req.ip }, msg);
}

/** The password step accepted `user` (with one-time codes on, `second_factor.accepted` follows). */
export function logSignInSucceeded(req: Request, user: Express.User): void {
  write(req, 'info', 'sign_in.succeeded', 'sign-in password accepted', { userId: user.id, role: user.role });
}

/**
 * The password step refused a sign-in. `accountId` is the account the address belongs to (null
 * when it belongs to nobody); `emailHash` the typed address, keyed-hashed.
 */
export function logSignInRefused(req: Request, refusal: { reason: SignInRefusal; accountId: number | null; emailHash: string }): void {
  write(req, 'warn', 'sign_in.refused', 'sign-in refused', { reason: refusal.reason, accountId: refusal.accountId ?? undefined, emailHash: refusal.emailHash });
}

/** Too many failed sign-ins: from this address (`address`), or for one account from it (`account`). */
export function logSignInRateLimited(req: Request, limit: 'address' | 'account'): void {
  write(req, 'warn', 'sign_in.rate_limited', 'sign-in rate limit reached', { limit });
}

/** The second step took a one-time code, or spent a recovery code (a lost or absent phone: `warn`). */
export function logSecondFactorAccepted(req: Request, userId: number, method: CodeMethod): void {
  if (method === 'recovery-code') write(req, 'warn', 'second_factor.recovery_code_used', 'recovery code used to sign in', { userId });
  else write(req, 'info', 'second_factor.accepted', 'one-time code accepted', { userId, method });
}

/** A one-time or recovery code was wrong or used already (sign-in, set-up, new recovery codes, switching off). */
export function logSecondFactorRefused(req: Request, userId: number, method: CodeMethod): void {
  write(req, 'warn', 'second_factor.refused', 'code refused', { userId, method });
}

/** Too many wrong codes for this member. */
export function logSecondFactorRateLimited(req: Request, userId: number | undefined): void {
  write(req, 'warn', 'second_factor.rate_limited', 'code rate limit reached', { userId });
}

/** The member switched one-time codes on, off, or replaced their recovery codes. */
export function logSecondFactorChanged(req: Request, userId: number, change: 'enabled' | 'disabled' | 'recovery_codes_renewed'): void {
  const messages = { enabled: 'one-time codes switched on', disabled: 'one-time codes switched off', recovery_codes_renewed: 'recovery codes replaced' };
  write(req, 'info', `second_factor.${change}`, messages[change], { userId });
}

/** An administrator (`userId`) removed a member's one-time and recovery codes. */
export function logSecondFactorReset(req: Request, userId: number, accountId: number): void {
  write(req, 'info', 'second_factor.reset', 'one-time codes reset by an administrator', { userId, accountId });
}

/** The member changed their own password; `endedSessions` of their other sessions ended. */
export function logPasswordChanged(req: Request, userId: number, endedSessions: number): void {
  write(req, 'info', 'password.changed', 'own password changed', { userId, endedSessions });
}

/** An own-password change was refused: the current password was wrong, or the new one too common. */
export function logPasswordChangeRefused(req: Request, userId: number, reason: 'wrong_current_password' | 'common_password'): void {
  write(req, 'warn', 'password.change_refused', 'own password change refused', { userId, reason });
}

/** Too many refused own-password changes for this member. */
export function logPasswordChangeRateLimited(req: Request, userId: number | undefined): void {
  write(req, 'warn', 'password.change_rate_limited', 'password change rate limit reached', { userId });
}

/** An administrator (`userId`) set a member's password. */
export function logPasswordSetByAdmin(req: Request, userId: number, accountId: number): void {
  write(req, 'info', 'password.set_by_admin', 'password set by an administrator', { userId, accountId });
}

/** An administrator (`userId`) created an account with `role`. */
export function logMemberCreated(req: Request, userId: number, accountId: number, role: Role): void {
  write(req, 'info', 'member.created', 'account created', { userId, accountId, role });
}

/** An administrator (`userId`) changed a member's role or switched the account on or off. */
export function logMemberAccessChanged(req: Request, userId: number, accountId: number, change: { role?: Role; active?: boolean }): void {
  write(req, 'info', 'member.access_changed', 'role or active state changed', { userId, accountId, role: change.role, active: change.active });
}

/** The member signed out. */
export function logSignOut(req: Request, userId: number): void {
  write(req, 'info', 'sign_out', 'signed out', { userId });
}

/**
 * Sessions were ended on request: the member's own other sessions (`scope` 'own_one' or
 * 'own_others'), or every session of another member by an administrator ('member', `accountId`).
 */
export function logSessionsEnded(req: Request, userId: number, scope: 'own_one' | 'own_others' | 'member', endedSessions: number, accountId?: number): void {
  write(req, 'info', 'sessions.ended', 'sessions ended on request', { userId, scope, endedSessions, ...(accountId === undefined ? {} : { accountId }) });
}

/** A session ended because it outlived the absolute limit (`userId`: its member, if signed in). */
export function logSessionExpired(req: Request, userId: number | undefined, reason: 'absolute'): void {
  write(req, 'info', 'session.expired', 'session ended by its time limit', { userId, reason });
}

/**
 * A 401 or 403 answer that no more specific event explained (role checks, services' refusals, the
 * second-factor gate), or a 404 marked by {@link asHiddenRefusal}. 403 and 404 at `warn`; 401 at
 * `info`, since a signed-out browser asking "who am I" gets one on every page load.
 */
export function logAccessRefused(req: Request, status: 401 | 403 | 404, code: ApiErrorCode): void {
  if (withEvent.has(req)) return;
  write(req, status === 401 ? 'info' : 'warn', 'access.refused', 'access refused', { userId: req.user?.id, status, code });
}

/**
 * A 400 answer (a body, parameter or query the schemas refuse): a possible attempt to get round
 * input validation (ASVS 5.0 §16.3.3). The names of the refused fields only, never their values;
 * at `info`, since the app's own forms check the same rules before sending.
 */
export function logInputRefused(req: Request, code: ApiErrorCode, fieldNames: readonly string[]): void {
  if (withEvent.has(req)) return;
  write(req, 'info', 'input.refused', 'input refused', { userId: req.user?.id, code, fields: fieldNames.slice(0, 20) });
}

/** A state-changing request refused by the CSRF defence: foreign origin, or token missing or wrong. */
export function logCsrfRefused(req: Request, reason: 'cross_site' | 'token'): void {
  write(req, 'warn', 'csrf.refused', 'cross-site request refused', { userId: req.user?.id, reason });
}

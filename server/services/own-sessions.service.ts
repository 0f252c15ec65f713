import { createHmac } from 'node:crypto';
import type { EndedSessions, OwnSession } from '@tidemark/shared';
import type { DatabaseSessionStore } from '../auth/session-store';
import type { SessionRow } from '../entities/session.entity';
import { HttpError } from '../http-error';

/** What of a stored session's data the list reads. */
interface StoredSessionData {
  signedInAt?: unknown;
  device?: unknown;
}

/**
 * A member's own sessions: the list (device, sign-in time, last activity) and ending one or all
 * the others (OWASP ASVS 5.0 §7.5.2); and an administrator ending every session of a member
 * (§7.4.5). Sessions are named by a keyed hash of their id, so the list never hands out a
 * session id that could be replayed as a cookie.
 */
export class OwnSessionsService {
  constructor(
    private readonly store: DatabaseSessionStore,
    private readonly secret: string,
    /** The idle limit: a row's expiry is its last activity plus this. */
    private readonly idleMs: number,
    /** Whether a team member with this id exists (an administrator's call on an unknown id is a 404). */
    private readonly memberExists: (userId: number) => Promise<boolean>,
  ) {}

  /** 22 base64url characters (132 bits) of HMAC-SHA-256 over the session id. */
  handleOf(sid: string): string {
    return createHmac('sha256', this.secret).update(`own-session-handle:${sid}`).digest('base64url').slice(0, 22);
  }

  /** The member's live sessions, the most recently active first. */
  async list(userId: number, currentSid: string): Promise<OwnSession[]> {
    const rows = await this.store.listForUser(userId);
    return rows.map((row) => this.describe(row, currentSid)).sort((a, b) => b.lastActiveAt.localeCompare(a.lastActiveAt));
  }

  /**
   * Ends one of the member's own sessions other than the current one.
   *
   * @throws {HttpError} 404 when no live session of theirs has that handle; 409 for the current one (sign out instead)
   */
  async end(userId: number, handle: string, currentSid: string): Promise<void> {
    const row = (await this.store.listForUser(userId)).find((candidate) => this.handleOf(candidate.sid) === handle);
    if (!row) throw HttpError.notFound('The session');
    if (row.sid === currentSid) throw HttpError.conflict('This is the session you are using: sign out instead.');
    await this.store.destroyOne(row.sid);
  }

  /** Ends every session of the member but the current one. */
  async endOthers(userId: number, currentSid: string): Promise<EndedSessions> {
    return { endedSessions: await this.store.destroyForUserExcept(userId, currentSid) };
  }

  /**
   * An administrator ends every session of another member (a lost or shared device).
   *
   * @throws {HttpError} 404 for an unknown member; 409 for their own account (their Sign-in protection page does that)
   */
  async endAllFor(userId: number, actingUserId: number): Promise<EndedSessions> {
    if (userId === actingUserId) throw HttpError.conflict('End your own sessions on your Sign-in protection page.');
    if (!(await this.memberExists(userId))) throw HttpError.notFound('The team member');
    return { endedSessions: await this.store.destroyForUser(userId) };
  }

  private describe(row: SessionRow, currentSid: string): OwnSession {
    const data = parseData(row.data);
    const signedInAt = typeof data.signedInAt === 'number' ? new Date(data.signedInAt).toISOString() : null;
    return {
      id: this.handleOf(row.sid),
      device: typeof data.device === 'string' && data.device !== '' ? data.device : 'Unknown browser',
      signedInAt,
      lastActiveAt: new Date(row.expiresAt - this.idleMs).toISOString(),
      isCurrent: row.sid === currentSid,
    };
  }
}

function parseData(text: string): StoredSessionData {
  try {
    const value: unknown = JSON.parse(text);
    return typeof value === 'object' && value !== null ? (value as StoredSessionData) : {};
  } catch {
    // A row written by something else: list it without details rather than fail the page.
    return {};
  }
}

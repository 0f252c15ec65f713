import session from 'express-session';
import type { DataSource, Repository } from 'typeorm';
import { LessThan } from 'typeorm';
import { SessionRow } from '../entities/session.entity';

/** Fallback lifetime for a row whose cookie has no expiry (never the case with our settings). */
const DEFAULT_TTL_MS = 30 * 60 * 1000;

/**
 * express-session store on the application's own database, so sessions survive a
 * restart and follow the data source to PostgreSQL. Rows carry the user id so that
 * deactivating someone can end every one of their sessions.
 */
export class DatabaseSessionStore extends session.Store {
  private readonly rows: Repository<SessionRow>;

  constructor(dataSource: DataSource) {
    super();
    this.rows = dataSource.getRepository(SessionRow);
  }

  override get(sid: string, callback: (error: unknown, data?: session.SessionData | null) => void): void {
    this.rows
      .findOneBy({ sid })
      .then((row) => {
        if (!row || Number(row.expiresAt) <= Date.now()) return callback(null, null);
        callback(null, JSON.parse(row.data) as session.SessionData);
      })
      .catch((error: unknown) => callback(error));
  }

  override set(sid: string, data: session.SessionData, callback?: (error?: unknown) => void): void {
    const expires = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Date.now() + DEFAULT_TTL_MS;
    const userId = typeof data.passport?.user === 'number' ? data.passport.user : null;
    this.rows
      .upsert({ sid, data: JSON.stringify(data), expiresAt: expires, userId }, ['sid'])
      .then(() => callback?.())
      .catch((error: unknown) => callback?.(error));
  }

  override touch(sid: string, data: session.SessionData, callback?: (error?: unknown) => void): void {
    const expires = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Date.now() + DEFAULT_TTL_MS;
    this.rows
      .update({ sid }, { expiresAt: expires })
      .then(() => callback?.())
      .catch((error: unknown) => callback?.(error));
  }

  override destroy(sid: string, callback?: (error?: unknown) => void): void {
    this.rows
      .delete({ sid })
      .then(() => callback?.())
      .catch((error: unknown) => callback?.(error));
  }

  /** Ends every session of one user (deactivation, password reset). */
  async destroyForUser(userId: number): Promise<number> {
    const result = await this.rows.delete({ userId });
    return result.affected ?? 0;
  }

  /** Deletes expired rows; express-session never does this itself. */
  async pruneExpired(now = Date.now()): Promise<number> {
    const result = await this.rows.delete({ expiresAt: LessThan(now) });
    return result.affected ?? 0;
  }

  /** Runs {@link pruneExpired} now and then every `intervalMs`; returns a stop function. */
  startPruning(intervalMs = 10 * 60 * 1000): () => void {
    const run = (): void => {
      this.pruneExpired().catch(() => {
        // A failed clean-up is retried at the next tick; sessions stay valid meanwhile.
      });
    };
    run();
    const timer = setInterval(run, intervalMs);
    timer.unref();
    return () => clearInterval(timer);
  }
}

import QRCode from 'qrcode';
import type { DataSource, Repository } from 'typeorm';
import { IsNull } from 'typeorm';
import {
  isSecondFactorRequired,
  type SecondFactorEnrolment,
  type SecondFactorPolicy,
  type SecondFactorState,
  type SecondFactorStatus,
  type SecondFactorVerifyRequest,
} from '@tidemark/shared';
import { canonicalRecoveryCode, hashRecoveryCode, isSameHash, newRecoveryCodes } from '../auth/recovery-codes';
import { SecretBox } from '../auth/secret-box';
import type { DatabaseSessionStore } from '../auth/session-store';
import { base32Secret, matchTotpStep, newTotpSecret, TOTP_SETTINGS, totpKeyUri } from '../auth/totp';
import { RecoveryCode } from '../entities/recovery-code.entity';
import { UserSecondFactor } from '../entities/user-second-factor.entity';
import { User } from '../entities/user.entity';
import { columnHydrator } from '../column-hydrator';
import { HttpError } from '../http-error';
import { portableSql } from '../portable-sql';

/** How long a secret handed out for enrolment can still be confirmed. */
export const ENROLMENT_VALID_MS = 15 * 60 * 1000;

/** The name authenticator apps show above the account. */
const ISSUER = 'Tidemark';

const INVALID_CODE_MESSAGE = 'That code is not right, or it was used already. Wait for the next code and try again.';
const INVALID_RECOVERY_MESSAGE = 'That recovery code is not right, or it was used already.';

/**
 * `user_second_factor.enabled_at` as the entity reads it (a `Date`, or null) in epoch ms, or
 * null when codes are off. Fails closed: a value that is not a time must never read as "off".
 *
 * @throws {Error} when the value is neither null nor a valid `Date`
 */
export function enabledAtMillis(hydrated: unknown): number | null {
  if (hydrated === null || hydrated === undefined) return null;
  if (!(hydrated instanceof Date) || Number.isNaN(hydrated.getTime())) throw new Error('A one-time-code set-up has an unreadable enabled_at.');
  return hydrated.getTime();
}

/** Options for {@link SecondFactorService}. */
export interface SecondFactorOptions {
  policy: SecondFactorPolicy;
  /** The app secret; the key that seals TOTP secrets is derived from it. */
  appSecret: string;
  /** Epoch milliseconds now; tests fix it. */
  clock?: () => number;
}

/**
 * One-time codes (TOTP, RFC 6238) and recovery codes: enrolment, the second sign-in step,
 * replay refusal, and switching off or resetting.
 */
export class SecondFactorService {
  readonly policy: SecondFactorPolicy;
  private readonly factors: Repository<UserSecondFactor>;
  private readonly recoveryCodes: Repository<RecoveryCode>;
  private readonly users: Repository<User>;
  private readonly box: SecretBox;
  private readonly clock: () => number;
  /** {@link enabledAt}'s statement (the gate has the value from the session's user lookup; sign-in and `GET /auth/me` ask here). */
  private readonly selectEnabledAt: string;
  /** `enabled_at` as the entity reads it (SQLite keeps UTC text, PostgreSQL a timestamptz). */
  private readonly hydrateEnabledAt: (raw: unknown) => unknown;

  constructor(
    private readonly dataSource: DataSource,
    private readonly sessions: DatabaseSessionStore,
    options: SecondFactorOptions,
  ) {
    this.policy = options.policy;
    this.factors = dataSource.getRepository(UserSecondFactor);
    this.recoveryCodes = dataSource.getRepository(RecoveryCode);
    this.users = dataSource.getRepository(User);
    this.box = new SecretBox(options.appSecret, 'totp-secret');
    this.clock = options.clock ?? Date.now;
    this.selectEnabledAt = portableSql(dataSource, 'SELECT enabled_at FROM user_second_factor WHERE user_id = ?');
    this.hydrateEnabledAt = columnHydrator(dataSource, UserSecondFactor, 'enabledAt');
  }

  /**
   * When the person's one-time codes were switched on (epoch ms), or null when they are off. One
   * parameterised statement, not `findOne`, whose query building cost several times the query.
   */
  async enabledAt(userId: number): Promise<number | null> {
    const [row] = await this.dataSource.query<Array<{ enabled_at: unknown }>>(this.selectEnabledAt, [userId]);
    return row ? enabledAtMillis(this.hydrateEnabledAt(row.enabled_at)) : null;
  }

  /**
   * Where a session stands. `verifiedFor` is the `enabledAt` of the set-up whose code was
   * checked in this session: if the person switched codes on (or on again) elsewhere since,
   * this session must show a code of the current set-up too. `enabledAtAsRead` is the set-up's
   * `enabledAt` when the caller read it already in this request (the gate: together with the
   * session's user, see UserService.findSessionPrincipal); left out, it is read now.
   */
  async stateFor(user: Express.User, verifiedFor: number | undefined, enabledAtAsRead?: number | null): Promise<SecondFactorState> {
    const enabledAt = enabledAtAsRead === undefined ? await this.enabledAt(user.id) : enabledAtAsRead;
    if (enabledAt !== null) return verifiedFor === enabledAt ? 'verified' : 'pending';
    return isSecondFactorRequired(user.role, this.policy) ? 'enrolment-required' : 'none';
  }

  async status(user: Express.User): Promise<SecondFactorStatus> {
    const enabledAt = await this.enabledAt(user.id);
    const recoveryCodesLeft = enabledAt === null ? 0 : await this.recoveryCodes.countBy({ userId: user.id, usedAt: IsNull() });
    return {
      isEnabled: enabledAt !== null,
      enabledAt: enabledAt === null ? null : new Date(enabledAt).toISOString(),
      recoveryCodesLeft,
      isRequired: isSecondFactorRequired(user.role, this.policy),
      policy: this.policy,
    };
  }

  /** Hands out a new secret to add to an authenticator app; it works once confirmed with a code. */
  async startEnrolment(user: Express.User): Promise<SecondFactorEnrolment> {
    const row = (await this.factors.findOneBy({ userId: user.id })) ?? this.factors.create({ userId: user.id, secretSealed: null, enabledAt: null, lastUsedStep: null });
    if (row.enabledAt) throw HttpError.conflict('One-time codes are already on. Switch them off first to set up a new app.');
    const secret = newTotpSecret();
    row.pendingSecretSealed = this.box.seal(secret, ownerOf(user.id));
    row.pendingSince = new Date(this.clock());
    await this.factors.save(row);
    const otpauthUri = totpKeyUri(secret, ISSUER, user.email);
    // Rendered here, not by a third-party service: the secret must not leave the server except to the person.
    const svg = await QRCode.toString(otpauthUri, { type: 'svg', errorCorrectionLevel: 'M', margin: 2 });
    return {
      otpauthUri,
      secret: base32Secret(secret),
      qrCodeDataUrl: `data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}`,
      digits: TOTP_SETTINGS.digits,
      periodSeconds: TOTP_SETTINGS.periodSeconds,
    };
  }

  /**
   * Switches one-time codes on once a code from the new secret checks out. Returns the
   * recovery codes (shown once; only their hashes are kept) and the new `enabledAt`.
   */
  async confirmEnrolment(user: Express.User, code: string): Promise<{ recoveryCodes: string[]; enabledAt: number }> {
    const row = await this.factors.findOneBy({ userId: user.id });
    if (row?.enabledAt) throw HttpError.conflict('One-time codes are already on.');
    const now = this.clock();
    if (!row?.pendingSecretSealed || !row.pendingSince || now - new Date(row.pendingSince).getTime() > ENROLMENT_VALID_MS) {
      throw HttpError.conflict('The set-up has expired or was not started. Start again to get a new QR code.');
    }
    const secret = this.box.open(row.pendingSecretSealed, ownerOf(user.id));
    const step = matchTotpStep({ secret, code, nowMs: now });
    if (step === null) throw invalidCode();
    const enabledAt = new Date(now);
    const recoveryCodes = newRecoveryCodes();
    await this.dataSource.transaction(async (manager) => {
      await manager.update(
        UserSecondFactor,
        { userId: user.id },
        // The confirming code's step counts as used: it cannot open a sign-in afterwards.
        { secretSealed: row.pendingSecretSealed, enabledAt, lastUsedStep: step, pendingSecretSealed: null, pendingSince: null },
      );
      await manager.delete(RecoveryCode, { userId: user.id });
      await manager.insert(RecoveryCode, recoveryCodes.map((plain) => this.recoveryRow(user.id, plain, enabledAt)));
    });
    return { recoveryCodes, enabledAt: enabledAt.getTime() };
  }

  /**
   * The second sign-in step: a current one-time code or an unused recovery code.
   * Returns the set-up's `enabledAt` for the session to remember.
   */
  async verify(userId: number, request: SecondFactorVerifyRequest): Promise<number> {
    const row = await this.enabledRow(userId);
    if (request.method === 'one-time-code') {
      await this.consumeOneTimeCode(row, request.code);
    } else {
      await this.consumeRecoveryCode(userId, request.code);
    }
    return new Date(row.enabledAt ?? 0).getTime();
  }

  /** A new set of recovery codes (the old ones stop working); needs a current one-time code. */
  async regenerateRecoveryCodes(user: Express.User, code: string): Promise<string[]> {
    const row = await this.enabledRow(user.id);
    await this.consumeOneTimeCode(row, code);
    const recoveryCodes = newRecoveryCodes();
    const now = new Date(this.clock());
    await this.dataSource.transaction(async (manager) => {
      await manager.delete(RecoveryCode, { userId: user.id });
      await manager.insert(RecoveryCode, recoveryCodes.map((plain) => this.recoveryRow(user.id, plain, now)));
    });
    return recoveryCodes;
  }

  /** Switches one-time codes off; needs a current code, and is refused where the role must keep them. */
  async disable(user: Express.User, code: string, keepSid: string): Promise<void> {
    if (isSecondFactorRequired(user.role, this.policy)) {
      throw HttpError.forbidden('Your role must keep one-time codes on. An administrator can reset them if your phone is lost.');
    }
    const row = await this.enabledRow(user.id);
    await this.consumeOneTimeCode(row, code);
    await this.removeAll(user.id);
    // A sign-in factor changed: the member's other sessions end, this one carries on (OWASP ASVS 5.0 §7.4.3).
    await this.sessions.destroyForUserExcept(user.id, keepSid);
  }

  /**
   * An administrator's reset (e.g. a lost phone): removes the member's one-time codes and
   * recovery codes and ends every session of theirs. The member sets up codes again at their
   * next sign-in if their role requires them. `actingUserId` is the administrator, or null for
   * the server's command line.
   */
  async reset(userId: number, actingUserId: number | null): Promise<void> {
    // null: the server machine's command line (npm run reset-sign-in), where a lone admin may reset their own.
    if (actingUserId !== null && userId === actingUserId) {
      throw HttpError.conflict('Change your own one-time codes on your Sign-in protection page.');
    }
    if (!(await this.users.existsBy({ id: userId }))) throw HttpError.notFound('The team member');
    await this.removeAll(userId);
    await this.sessions.destroyForUser(userId);
  }

  private async removeAll(userId: number): Promise<void> {
    await this.dataSource.transaction(async (manager) => {
      await manager.delete(RecoveryCode, { userId });
      await manager.delete(UserSecondFactor, { userId });
    });
  }

  private async enabledRow(userId: number): Promise<UserSecondFactor> {
    const row = await this.factors.findOneBy({ userId });
    if (!row?.enabledAt || !row.secretSealed) throw HttpError.conflict('One-time codes are not on for this account.');
    return row;
  }

  /**
   * Accepts a code of the current step ±1 whose step is later than the last one used, and
   * records its step in the same statement, so a code is good once even with two requests racing.
   */
  private async consumeOneTimeCode(row: UserSecondFactor, code: string): Promise<void> {
    const secret = this.box.open(row.secretSealed ?? '', ownerOf(row.userId));
    const step = matchTotpStep({ secret, code, nowMs: this.clock() });
    if (step === null) throw invalidCode();
    const result = await this.factors
      .createQueryBuilder()
      .update(UserSecondFactor)
      .set({ lastUsedStep: step })
      .where('user_id = :userId AND (last_used_step IS NULL OR last_used_step < :step)', { userId: row.userId, step })
      .execute();
    if (result.affected !== 1) throw invalidCode();
  }

  private async consumeRecoveryCode(userId: number, typed: string): Promise<void> {
    const canonical = canonicalRecoveryCode(typed);
    if (!canonical) throw invalidCode(INVALID_RECOVERY_MESSAGE);
    const hash = hashRecoveryCode(canonical);
    const unused = await this.recoveryCodes.findBy({ userId, usedAt: IsNull() });
    // Compare against each unused code in constant time rather than asking the database for the hash.
    const match = unused.find((candidate) => isSameHash(candidate.codeHash, hash));
    if (!match) throw invalidCode(INVALID_RECOVERY_MESSAGE);
    const result = await this.recoveryCodes.update({ id: match.id, usedAt: IsNull() }, { usedAt: new Date(this.clock()) });
    if (result.affected !== 1) throw invalidCode(INVALID_RECOVERY_MESSAGE);
  }

  private recoveryRow(userId: number, plain: string, createdAt: Date): Partial<RecoveryCode> {
    const canonical = canonicalRecoveryCode(plain);
    if (!canonical) throw new Error('A generated recovery code did not match its own format.');
    return { userId, codeHash: hashRecoveryCode(canonical), usedAt: null, createdAt };
  }
}

/** Additional authenticated data binding a sealed secret to its row's owner. */
function ownerOf(userId: number): string {
  return `user:${userId}`;
}

function invalidCode(message = INVALID_CODE_MESSAGE): HttpError {
  return new HttpError(401, 'second_factor_invalid', message, { code: message });
}

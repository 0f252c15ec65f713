import { IsNull, Not, type DataSource, type Repository } from 'typeorm';
import type { PasswordChange, Role, UserView } from '@tidemark/shared';
import { z } from 'zod';
import { userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { isCommonPassword } from '../auth/common-passwords';
import { isMadeOfContextWords } from '../auth/context-words';
import { hashPassword, verifyPassword, type ScryptCost } from '../auth/password';
import type { DatabaseSessionStore } from '../auth/session-store';
import { UserSecondFactor } from '../entities/user-second-factor.entity';
import { User } from '../entities/user.entity';
import { columnHydrator } from '../column-hydrator';
import { HttpError } from '../http-error';
import { portableSql } from '../portable-sql';
import { enabledAtMillis } from './second-factor.service';

type UserCreate = z.output<typeof userCreateSchema>;
type UserUpdate = z.output<typeof userUpdateSchema>;

/** Turns a row into what the API returns (never the hash, nor anything of the second factor but whether it is on). */
export function mapUser(user: User, secondFactorEnabled: boolean): UserView {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    active: user.active,
    createdAt: new Date(user.createdAt).toISOString(),
    lastSignInAt: user.lastSignInAt ? new Date(user.lastSignInAt).toISOString() : null,
    secondFactorEnabled,
  };
}

/** Alias of the joined set-up's "switched on" flag in {@link UserService.list}'s raw rows. */
const FACTOR_ON = 'factor_on';

/** Who a signed-in session belongs to, as read on every request. */
export interface SessionPrincipal {
  user: Express.User;
  /** When their one-time codes were switched on (epoch ms), or null when they are off. */
  secondFactorEnabledAt: number | null;
}

/** A row of {@link UserService.findSessionPrincipal}'s statement, as the driver returns it. */
interface SessionPrincipalRow {
  email: string;
  display_name: string;
  role: Role;
  active: unknown;
  enabled_at: unknown;
}

/** Why the password step refused a sign-in. */
export type SignInRefusal = 'unknown_account' | 'wrong_password' | 'inactive';

/** What {@link UserService.authenticate} found: the member, or the refusal and the account the address belongs to (null: nobody's). */
export type PasswordCheck = { user: Express.User } | { refusal: SignInRefusal; accountId: number | null };

/** Users, sign-in checks and administration. */
export class UserService {
  private readonly users: Repository<User>;
  private readonly factors: Repository<UserSecondFactor>;
  /** Every signed-in request's lookup as one parameterised statement (see {@link findSessionPrincipal}). */
  private readonly selectSessionPrincipal: string;
  /** `user.active` as the entity reads it (SQLite stores 0/1, PostgreSQL a boolean). */
  private readonly hydrateActive: (raw: unknown) => unknown;
  /** `user_second_factor.enabled_at` as the entity reads it (SQLite keeps UTC text, PostgreSQL a timestamptz). */
  private readonly hydrateEnabledAt: (raw: unknown) => unknown;
  /** Compared against when the e-mail is unknown, so both failures take the same time. */
  private dummyHash: Promise<string> | undefined;

  constructor(
    private readonly dataSource: DataSource,
    private readonly sessions: DatabaseSessionStore,
    private readonly scryptCost: ScryptCost,
  ) {
    this.users = dataSource.getRepository(User);
    this.factors = dataSource.getRepository(UserSecondFactor);
    this.selectSessionPrincipal = portableSql(
      dataSource,
      'SELECT u.email, u.display_name, u.role, u.active, f.enabled_at FROM "user" u LEFT JOIN user_second_factor f ON f.user_id = u.id WHERE u.id = ?',
    );
    this.hydrateActive = columnHydrator(dataSource, User, 'active');
    this.hydrateEnabledAt = columnHydrator(dataSource, UserSecondFactor, 'enabledAt');
  }

  /**
   * The active user with these credentials, or why not (for the security log only; the person
   * is told the same sentence whatever the reason). Records the sign-in time.
   */
  async authenticate(email: string, password: string): Promise<PasswordCheck> {
    const user = await this.users.findOneBy({ email: email.trim().toLowerCase() });
    if (!user) {
      this.dummyHash ??= hashPassword('not-a-real-password', this.scryptCost);
      await verifyPassword(password, await this.dummyHash);
      return { refusal: 'unknown_account', accountId: null };
    }
    const isMatch = await verifyPassword(password, user.passwordHash);
    // "inactive" only with the right password: a deactivated member's password in someone's hands.
    if (!isMatch) return { refusal: 'wrong_password', accountId: user.id };
    if (!user.active) return { refusal: 'inactive', accountId: user.id };
    await this.users.update({ id: user.id }, { lastSignInAt: new Date() });
    return { user: { id: user.id, email: user.email, displayName: user.displayName, role: user.role } };
  }

  /**
   * The session's user if they still exist and are active, with their one-time-code state, which
   * the second-factor gate needs next. Every signed-in request asks (passport's deserializeUser),
   * so it is one parameterised statement: through repositories these were two `findOneBy`s whose
   * query building cost several times the queries. Values are converted exactly as the entities
   * would read them.
   */
  async findSessionPrincipal(id: number): Promise<SessionPrincipal | null> {
    const [row] = await this.dataSource.query<SessionPrincipalRow[]>(this.selectSessionPrincipal, [id]);
    if (!row || this.hydrateActive(row.active) !== true) return null;
    return {
      user: { id, email: row.email, displayName: row.display_name, role: row.role },
      secondFactorEnabledAt: enabledAtMillis(this.hydrateEnabledAt(row.enabled_at)),
    };
  }

  /** Everyone with an account, by name, each with whether their one-time codes are on: one query, however large the team. */
  async list(): Promise<UserView[]> {
    const { entities, raw } = await this.users
      .createQueryBuilder('user')
      // A row with only a pending (unconfirmed) set-up does not count: its codes do not work yet.
      .leftJoin(UserSecondFactor, 'factor', 'factor.userId = user.id AND factor.enabledAt IS NOT NULL')
      .addSelect('CASE WHEN factor.userId IS NULL THEN 0 ELSE 1 END', FACTOR_ON)
      .orderBy('user.displayName', 'ASC')
      .addOrderBy('user.id', 'ASC')
      .getRawAndEntities<Record<string, unknown>>();
    // Matched by id rather than by position, so the pairing never depends on how TypeORM groups rows.
    const isOn = new Map(raw.map((row) => [Number(row['user_id']), Number(row[FACTOR_ON]) === 1]));
    return entities.map((user) => mapUser(user, isOn.get(user.id) ?? false));
  }

  async create(input: UserCreate): Promise<UserView> {
    this.assertNotGuessable(input.password, [input.displayName, input.email]);
    if (await this.users.existsBy({ email: input.email })) {
      throw HttpError.conflict('Someone with this e-mail address is already on the team.');
    }
    const user = this.users.create({
      email: input.email,
      displayName: input.displayName,
      role: input.role,
      active: true,
      passwordHash: await hashPassword(input.password, this.scryptCost),
      lastSignInAt: null,
    });
    // A new account has no one-time codes until its owner sets them up.
    return mapUser(await this.users.save(user), false);
  }

  async update(id: number, change: UserUpdate, actingUserId: number): Promise<UserView> {
    const user = await this.users.findOneBy({ id });
    if (!user) throw HttpError.notFound('The team member');
    if (change.password !== undefined) this.assertNotGuessable(change.password, [change.displayName ?? user.displayName, user.email]);
    const isLosingAdmin = user.role === 'admin' && user.active && (change.active === false || (change.role !== undefined && change.role !== 'admin'));
    if (isLosingAdmin && (await this.users.countBy({ role: 'admin', active: true })) <= 1) {
      throw HttpError.conflict('This would leave the practice without an active administrator.');
    }
    if (id === actingUserId && change.active === false) {
      throw HttpError.conflict('You cannot deactivate your own account.');
    }
    if (change.displayName !== undefined) user.displayName = change.displayName;
    if (change.role !== undefined) user.role = change.role as Role;
    if (change.active !== undefined) user.active = change.active;
    if (change.password !== undefined) user.passwordHash = await hashPassword(change.password, this.scryptCost);
    const saved = await this.users.save(user);
    // Deactivation, a role change or a password reset ends the person's sessions everywhere.
    if (change.active === false || change.password !== undefined || change.role !== undefined) {
      await this.sessions.destroyForUser(id);
    }
    return mapUser(saved, await this.isSecondFactorOn(id));
  }

  /**
   * A member changes their own password (OWASP ASVS 5.0 §6.2.2–6.2.3): the current one must be
   * right, the new one not common. Every other session of theirs ends (§7.4.3); the one given
   * stays signed in. Returns the member and how many sessions ended.
   *
   * @throws {HttpError} 400 with a field error when the current password is wrong or the new one is common
   */
  async changeOwnPassword(userId: number, change: PasswordChange, keepSid: string): Promise<{ user: User; endedSessions: number }> {
    const user = await this.users.findOneBy({ id: userId, active: true });
    if (!user) throw HttpError.notFound('Your account');
    if (!(await verifyPassword(change.currentPassword, user.passwordHash))) {
      throw HttpError.badRequest('Your current password is not right.', { currentPassword: 'This is not your current password.' });
    }
    this.assertNotGuessable(change.newPassword, [user.displayName, user.email], 'newPassword');
    await this.users.update({ id: userId }, { passwordHash: await hashPassword(change.newPassword, this.scryptCost) });
    const endedSessions = await this.sessions.destroyForUserExcept(userId, keepSid);
    return { user, endedSessions };
  }

  /** Creates a user unless the e-mail exists (tests and the demo seed). */
  async ensure(input: UserCreate): Promise<void> {
    await this.ensureAll([input], input.password);
  }

  /**
   * Creates the missing accounts, all with one password hashed once (demo seeding only:
   * one hash keeps the first start quick at OWASP cost). Returns how many were created.
   */
  async ensureAll(accounts: ReadonlyArray<Omit<UserCreate, 'password'>>, password: string): Promise<number> {
    const missing: Array<Omit<UserCreate, 'password'>> = [];
    for (const account of accounts) {
      if (!(await this.users.existsBy({ email: account.email }))) missing.push(account);
    }
    if (missing.length === 0) return 0;
    const passwordHash = await hashPassword(password, this.scryptCost);
    await this.users.save(missing.map((account) => this.users.create({ ...account, active: true, passwordHash, lastSignInAt: null })));
    return missing.length;
  }

  /** Whether a team member with this id exists (active or not). */
  async exists(id: number): Promise<boolean> {
    return this.users.existsBy({ id });
  }

  async count(): Promise<number> {
    return this.users.count();
  }

  /** Whether the member's one-time codes are on (a pending, unconfirmed set-up does not count). */
  private async isSecondFactorOn(userId: number): Promise<boolean> {
    return this.factors.existsBy({ userId, enabledAt: Not(IsNull()) });
  }

  /**
   * Refuses a password on the common-password list (ASVS 5.0 §6.2.4) or made only of context
   * words — Tidemark, the roles, the trade's words, the member's own name and e-mail (§6.2.11).
   */
  private assertNotGuessable(password: string, personalWords: readonly string[], field = 'password'): void {
    if (isCommonPassword(password)) {
      throw HttpError.badRequest('Choose a less common password.', { [field]: 'This password is on a list of common passwords. Choose another.' });
    }
    if (isMadeOfContextWords(password, personalWords)) {
      throw HttpError.badRequest('Choose a harder password to guess.', {
        [field]: 'This password is made only of words anyone would try here (Tidemark, the trade, the person’s name). Add words of your own.',
      });
    }
  }
}

import type { DataSource, Repository } from 'typeorm';
import type { Role, UserView } from '@tidemark/shared';
import { z } from 'zod';
import { userCreateSchema, userUpdateSchema } from '@tidemark/shared';
import { isCommonPassword } from '../auth/common-passwords';
import { hashPassword, verifyPassword, type ScryptCost } from '../auth/password';
import type { DatabaseSessionStore } from '../auth/session-store';
import { User } from '../entities/user.entity';
import { HttpError } from '../http-error';

type UserCreate = z.output<typeof userCreateSchema>;
type UserUpdate = z.output<typeof userUpdateSchema>;

/** Turns a row into what the API returns (never the hash). */
export function mapUser(user: User): UserView {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    active: user.active,
    createdAt: new Date(user.createdAt).toISOString(),
    lastSignInAt: user.lastSignInAt ? new Date(user.lastSignInAt).toISOString() : null,
  };
}

/** Users, sign-in checks and administration. */
export class UserService {
  private readonly users: Repository<User>;
  /** Compared against when the e-mail is unknown, so both failures take the same time. */
  private dummyHash: Promise<string> | undefined;

  constructor(
    dataSource: DataSource,
    private readonly sessions: DatabaseSessionStore,
    private readonly scryptCost: ScryptCost,
  ) {
    this.users = dataSource.getRepository(User);
  }

  /** The active user with these credentials, or null. Records the sign-in time. */
  async authenticate(email: string, password: string): Promise<Express.User | null> {
    const user = await this.users.findOneBy({ email: email.trim().toLowerCase() });
    if (!user) {
      this.dummyHash ??= hashPassword('not-a-real-password', this.scryptCost);
      await verifyPassword(password, await this.dummyHash);
      return null;
    }
    const isMatch = await verifyPassword(password, user.passwordHash);
    if (!isMatch || !user.active) return null;
    await this.users.update({ id: user.id }, { lastSignInAt: new Date() });
    return { id: user.id, email: user.email, displayName: user.displayName, role: user.role };
  }

  /** The session's user if they still exist and are active. */
  async findActiveSessionUser(id: number): Promise<Express.User | null> {
    const user = await this.users.findOneBy({ id });
    if (!user || !user.active) return null;
    return { id: user.id, email: user.email, displayName: user.displayName, role: user.role };
  }

  async list(): Promise<UserView[]> {
    const rows = await this.users.find({ order: { displayName: 'ASC' } });
    return rows.map(mapUser);
  }

  async create(input: UserCreate): Promise<UserView> {
    this.assertNotCommon(input.password);
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
    return mapUser(await this.users.save(user));
  }

  async update(id: number, change: UserUpdate, actingUserId: number): Promise<UserView> {
    const user = await this.users.findOneBy({ id });
    if (!user) throw HttpError.notFound('The team member');
    if (change.password !== undefined) this.assertNotCommon(change.password);
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
    return mapUser(saved);
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

  async count(): Promise<number> {
    return this.users.count();
  }

  private assertNotCommon(password: string): void {
    if (isCommonPassword(password)) {
      throw HttpError.badRequest('Choose a less common password.', { password: 'This password is on a list of common passwords. Choose another.' });
    }
  }
}

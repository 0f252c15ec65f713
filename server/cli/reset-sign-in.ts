/**
 * `npm run reset-sign-in -- <e-mail>`: run on the server machine when a member — typically the
 * only administrator — has lost both their authenticator and their recovery codes. Removes the
 * member's one-time codes and recovery codes and ends every session of theirs, through the same
 * service method as the Team page's "Reset sign-in protection"; at their next sign-in they set
 * up codes again if their role requires them. The password is left as it is.
 *
 * Finds the database as `npm run backup` does (TIDEMARK_DATA_DIR, or DATABASE_URL for
 * PostgreSQL) and may run while the server runs. Exit codes:
 * - 0: codes reset, or the member had none (nothing to reset: nothing was changed);
 * - 1: refused, nothing changed — no member with that e-mail, no database, a database that is not
 *   at this version's schema — or the database failed;
 * - 2: usage error (no e-mail, more than one argument, or an option).
 */
import 'reflect-metadata';
import { existsSync } from 'node:fs';
import type { DataSource } from 'typeorm';
import { isSecondFactorRequired } from '@tidemark/shared';
import { DatabaseSessionStore } from '../auth/session-store';
import { loadConfig, type ServerConfig } from '../config';
import { createDataSource } from '../data-source';
import { SessionRow } from '../entities/session.entity';
import { User } from '../entities/user.entity';
import { knownMigrationNames } from '../maintenance/database-restore';
import { SecondFactorService } from '../services/second-factor.service';

const USAGE = 'Usage: npm run reset-sign-in -- <e-mail> (one member’s e-mail address; no options).';

/** A refusal or failure to report in one sentence with an exit code (never a stack trace). */
class CommandRefusal extends Error {
  constructor(
    message: string,
    readonly exitCode: 1 | 2,
  ) {
    super(message);
    this.name = 'CommandRefusal';
  }
}

/** The e-mail argument; anything else is a usage error. */
function emailArgument(args: readonly string[]): string {
  const option = args.find((arg) => arg.startsWith('-'));
  if (option) throw new CommandRefusal(`Unknown option ${option}: this command only resets a member’s second factor. ${USAGE}`, 2);
  const [email] = args;
  if (args.length !== 1 || !email?.trim()) throw new CommandRefusal(USAGE, 2);
  return email.trim().toLowerCase();
}

/** Opens the configured database without creating or migrating it. */
async function openExisting(config: ServerConfig): Promise<DataSource> {
  if (!config.databaseUrl && !existsSync(config.databaseFile)) {
    throw new CommandRefusal(`No database at ${config.databaseFile}: check TIDEMARK_DATA_DIR (or DATABASE_URL for PostgreSQL). Nothing was changed.`, 1);
  }
  const dataSource = createDataSource({ database: config.databaseFile, url: config.databaseUrl });
  try {
    await dataSource.initialize();
  } catch (error) {
    // An unreachable or missing PostgreSQL database, or a file that is not SQLite: one sentence
    // (DATABASE_URL itself, which may hold a password, is not repeated).
    const where = config.databaseUrl ? 'the PostgreSQL database named by DATABASE_URL' : config.databaseFile;
    throw new CommandRefusal(`Could not open ${where}: ${error instanceof Error ? error.message : String(error)}. Nothing was changed.`, 1);
  }
  return dataSource;
}

/** Refuses a database whose recorded migrations are not exactly this version's (not Tidemark's, older, or newer). */
async function requireCurrentSchema(dataSource: DataSource, where: string): Promise<void> {
  const runner = dataSource.createQueryRunner();
  try {
    const applied = (await runner.hasTable('migrations')) ? ((await runner.query('SELECT name FROM migrations ORDER BY id')) as { name: string }[]).map((row) => row.name) : [];
    if (applied.join('\n') !== knownMigrationNames().join('\n')) {
      throw new CommandRefusal(`The database at ${where} is not a Tidemark database at this version's schema: start the server (or run npm run migrate) first. Nothing was changed.`, 1);
    }
  } finally {
    await runner.release();
  }
}

/** Resets the member's second factor; returns the line to print. */
async function resetSignIn(dataSource: DataSource, config: ServerConfig, email: string): Promise<string> {
  const member = await dataSource.getRepository(User).findOneBy({ email });
  if (!member) throw new CommandRefusal(`No member with the e-mail ${email}. Nothing was changed.`, 1);
  const policy = config.isDemo ? 'offered' : 'required';
  const secondFactors = new SecondFactorService(dataSource, new DatabaseSessionStore(dataSource), { policy, appSecret: config.secret });
  if ((await secondFactors.enabledAt(member.id)) === null) {
    return `${email} (${member.role}) has no second factor set up: nothing to reset, nothing was changed.`;
  }
  const sessions = await dataSource.getRepository(SessionRow).countBy({ userId: member.id });
  // No signed-in member acts here (null): the server machine's operator does, so a lone admin may reset their own.
  await secondFactors.reset(member.id, null);
  const next = isSecondFactorRequired(member.role, policy) ? 'they set up one-time codes again at their next sign-in' : 'they sign in with their password alone until they set codes up again';
  return `Sign-in protection reset for ${email} (${member.role}): one-time and recovery codes removed, ${sessions} ${sessions === 1 ? 'session' : 'sessions'} ended; ${next}.`;
}

let dataSource: DataSource | null = null;
try {
  const email = emailArgument(process.argv.slice(2));
  const config = loadConfig();
  dataSource = await openExisting(config);
  await requireCurrentSchema(dataSource, config.databaseUrl ? 'DATABASE_URL (PostgreSQL)' : config.databaseFile);
  console.log(await resetSignIn(dataSource, config, email));
} catch (error) {
  // A command line answers with a sentence and an exit code, not a stack trace.
  if (error instanceof CommandRefusal) {
    console.error(error.message);
    process.exitCode = error.exitCode;
  } else {
    console.error(`Reset failed: ${error instanceof Error ? error.message : String(error)}`);
    process.exitCode = 1;
  }
} finally {
  if (dataSource?.isInitialized) await dataSource.destroy();
}

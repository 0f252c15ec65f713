import type { DataSource } from 'typeorm';
import '../../../server/auth/session-types';

/** The signed-in person as the services expect it, read from the database by e-mail (child processes have no session). */
export async function storedUser(dataSource: DataSource, email: string): Promise<Express.User> {
  const rows = (await dataSource.query('SELECT id, email, display_name AS displayName, role FROM "user" WHERE email = ?', [email])) as Express.User[];
  const user = rows[0];
  if (!user) throw new Error(`No account ${email} in the database.`);
  return { id: Number(user.id), email: user.email, displayName: user.displayName, role: user.role };
}

import type { UserService } from '../services/user.service';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';

/** Seeds the demo accounts (idempotent). Later releases add the demo practice here. */
export async function seedDemo(users: UserService): Promise<void> {
  for (const account of DEMO_ACCOUNTS) {
    await users.ensure({ ...account, password: DEMO_PASSWORD });
  }
}

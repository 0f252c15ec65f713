import type { Page } from 'playwright-core';
import type { Role } from '@tidemark/shared';

/** The demo accounts' shared password (README, "Demo accounts"; demo only). */
export const DEMO_PASSWORD = 'tidemark-demo';

/** One demo account per role, as the demo seed creates them. */
export const DEMO_ACCOUNTS: Record<Role, string> = {
  admin: 'admin@example.org',
  audit_lead: 'lead@example.org',
  clinician: 'clinician@example.org',
  partner: 'partner@example.org',
  governance: 'governance@example.org',
};

/**
 * Fills and sends the sign-in form of a page already showing it. Demo mode offers one-time codes
 * but requires them of no one, so the password is the only step.
 */
export async function submitSignIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByRole('textbox', { name: 'Password' }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * Opens Tidemark, is sent to sign in, signs in and waits until the shell is open. Waits for the
 * shell's main area rather than the menu: on a tablet the menu folds away behind a button.
 */
export async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(baseUrl);
  await page.waitForURL(/\/sign-in/);
  await submitSignIn(page, email);
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.getByRole('main').waitFor();
}

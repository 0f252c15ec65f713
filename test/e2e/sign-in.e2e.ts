import type { Browser } from 'playwright-core';
import type { Role } from '@tidemark/shared';
import { launchBrowser, screenshotPath } from './support/browser';
import { startServer, type RunningServer } from './support/server';
import { DEMO_ACCOUNTS, submitSignIn } from './support/sign-in';

/** Navigation each role must see — DESIGN.md §2 (capabilities) and §5 (screens). */
const EXPECTED_NAVIGATION: Record<Role, string[]> = {
  admin: ['Cases', 'Change history', 'Team', 'Outbox', 'Settings'],
  audit_lead: ['Today', 'Cases', 'Audits', 'Reports', 'Change history'],
  clinician: ['Today', 'Cases', 'Audits', 'Change history'],
  partner: ['Cases', 'Audits', 'Reports', 'Change history'],
  governance: ['Audits', 'Reports'],
};

describe('sign-in journey in Chromium', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  for (const role of Object.keys(EXPECTED_NAVIGATION) as Role[]) {
    it(`${role} signs in, sees only their navigation and signs out`, async () => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      const problems: string[] = [];
      page.on('console', (message) => {
        // The browser logs the expected 401 of "who am I?" before sign-in; anything else (CSP, script errors) is a problem.
        if (message.type() === 'error' && !/status of 401/.test(message.text())) problems.push(message.text());
      });
      page.on('pageerror', (error) => problems.push(error.message));

      await page.goto(server.baseUrl);
      await page.waitForURL(/\/sign-in/);
      if (role === 'admin') await page.screenshot({ path: screenshotPath('sign-in'), fullPage: true });
      await submitSignIn(page, DEMO_ACCOUNTS[role]);

      const nav = page.getByRole('navigation', { name: 'Main navigation' });
      await nav.getByRole('link').first().waitFor();
      const links = (await nav.getByRole('link').allInnerTexts()).map((text) => text.replace(/\s+/g, ' ').trim());
      const labels = links.map((text) => EXPECTED_NAVIGATION[role].find((label) => text.endsWith(label)) ?? text);
      expect(labels).toEqual(EXPECTED_NAVIGATION[role]);
      await page.screenshot({ path: screenshotPath(`shell-${role}`), fullPage: true });

      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/sign-in/);
      expect(problems).toEqual([]);
      await context.close();
    });
  }

  it('shows the server’s message for a wrong password', async () => {
    const page = await browser.newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    await submitSignIn(page, DEMO_ACCOUNTS.audit_lead, 'not-the-password');
    await expect(page.getByRole('alert').first().innerText()).resolves.toMatch(/not right/);
    await page.screenshot({ path: screenshotPath('sign-in-failed'), fullPage: true });
    await page.close();
  });
});

import { Secret, TOTP } from 'otpauth';
import QRCode from 'qrcode';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { AuthenticatorApp } from './support/authenticator-app';
import { launchBrowser } from './support/browser';
import { watchNetwork, type NetworkProblems } from './support/network-problems';
import { watchProblems } from './support/page-problems';
import { waitForAnimationsToSettle } from './support/settled-animations';
import { startServer, type RunningServer } from './support/server';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, signIn, submitSignIn } from './support/sign-in';
import { screenshotWholePage } from './support/whole-page-screenshot';

/** The server's refusals, word for word (server/services/second-factor.service.ts, INVALID_CODE_MESSAGE and INVALID_RECOVERY_MESSAGE). */
const WRONG_CODE = 'That code is not right, or it was used already. Wait for the next code and try again.';
const WRONG_RECOVERY_CODE = 'That recovery code is not right, or it was used already.';
/** README, "Security in brief": 10 single-use recovery codes of 140 bits = 28 Crockford base32 symbols, printed in groups of four. */
const RECOVERY_CODE_COUNT = 10;
const RECOVERY_CODE_FORMAT = /^[0-9A-HJKMNP-TV-Z]{4}(-[0-9A-HJKMNP-TV-Z]{4}){6}$/;
/** Base32 (RFC 4648 §6 alphabet) in groups of four, as the page shows the key for typing. */
const GROUPED_KEY_FORMAT = /^[A-Z2-7]{4}( [A-Z2-7]{1,4})*$/;
/** The one refusal a page is expected to meet outside the code checks: "who am I?" before signing in. */
const SIGNED_OUT_PROBE = '401 GET /api/auth/me';
const VERIFY_REFUSED = '401 POST /api/auth/second-factor/verify';

/*
 * The second sign-in factor as the demo clinician meets it, in headless Debian Chromium: switching
 * on one-time codes on Sign-in protection with a code computed from the key the page shows (the
 * test plays the authenticator app, see support/authenticator-app.ts), then signing in with a wrong
 * code, a right code, a recovery code, and the same recovery code again; then changing the
 * password on the same page. The four steps build on
 * each other (one browser context, one account), so they run in order.
 */
describe('second sign-in factor in Chromium', () => {
  const email = DEMO_ACCOUNTS.clinician;
  let server: RunningServer;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  let consoleProblems: string[];
  let network: NetworkProblems;
  let app: AuthenticatorApp | undefined;
  let recoveryCodes: string[] = [];

  beforeAll(async () => {
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    // Sign-in runs scrypt and the machine is shared: give each wait room.
    context.setDefaultTimeout(30_000);
    page = await context.newPage();
    consoleProblems = watchProblems(page);
    network = watchNetwork(page);
  });
  afterAll(async () => {
    await context?.close();
    await browser?.close();
    await server?.stop();
  });
  afterEach(() => {
    // No script or console error and no request without an answer, in any step.
    expect(consoleProblems).toEqual([]);
    expect(network.failedRequests).toEqual([]);
  });

  /** The error answers since the last call, with the sign-in page's "who am I?" probe left out. */
  function errorAnswersSinceLastLook(): string[] {
    return network.errorAnswers.splice(0).filter((answer) => answer !== SIGNED_OUT_PROBE);
  }

  /** A whole-page picture once the page has stopped moving (test-results/<name>.png). */
  async function picture(name: string): Promise<void> {
    await waitForAnimationsToSettle(page);
    await screenshotWholePage(page, name);
  }

  async function signOut(): Promise<void> {
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in$/);
  }

  /** Sends e-mail and password from the sign-in page and waits for the code step. */
  async function reachCodeStep(): Promise<void> {
    await submitSignIn(page, email);
    await page.getByRole('heading', { level: 1, name: 'One more step' }).waitFor();
    await page.getByRole('textbox', { name: 'One-time code' }).waitFor();
  }

  /** The session is still only half signed in: the API refuses anything but the code. */
  async function expectCodeStillPending(): Promise<void> {
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    const probe = await page.request.get(`${server.baseUrl}/api/recalls/due`);
    expect(probe.status()).toBe(401);
    await expect(probe.json()).resolves.toMatchObject({ error: { code: 'second_factor_pending' } });
  }

  async function expectToday(): Promise<void> {
    await page.waitForURL(/\/today$/);
    await page.getByRole('heading', { level: 1, name: 'Today' }).waitFor();
  }

  it('1. the clinician switches on one-time codes with a code from the shown key and keeps the recovery codes', async () => {
    await signIn(page, server.baseUrl, email);
    await page.getByRole('button', { name: /: account menu$/ }).click();
    await page.getByRole('menuitem', { name: 'Sign-in protection' }).click();
    await page.waitForURL(/\/account\/security$/);
    await page.getByRole('heading', { level: 2, name: 'One-time codes are off' }).waitFor();
    await page.getByRole('button', { name: 'Set up one-time codes' }).click();

    const keyText = page.getByLabel('Key for manual entry');
    await keyText.waitFor();
    const shownKey = (await keyText.innerText()).trim();
    expect(shownKey).toMatch(GROUPED_KEY_FORMAT);
    // 160-bit secret (RFC 4226 §4 R6 recommends 160 bits) = 32 base32 characters.
    expect(shownKey.replace(/\s+/g, '')).toHaveLength(32);
    // The parameters the page states are RFC 6238's defaults, which the test's app uses.
    await page.getByText('6 digits, a new code every 30 seconds.').waitFor();

    // The QR code the server drew holds the key-URI of the same key: drawing the otpauth key-URI
    // (Key Uri Format, issuer Tidemark, the account's e-mail) for the shown key with the same
    // `qrcode` library and settings as server/services/second-factor.service.ts gives the same picture.
    const qr = page.getByRole('img', { name: 'QR code holding the key for your authenticator app' });
    await qr.waitFor();
    await expect(qr.evaluate((image: HTMLImageElement) => image.complete && image.naturalWidth > 0)).resolves.toBe(true);
    const qrSource = (await qr.getAttribute('src')) ?? '';
    expect(qrSource.startsWith('data:image/svg+xml;base64,')).toBe(true);
    const keyUri = new TOTP({
      issuer: 'Tidemark',
      label: email,
      secret: Secret.fromBase32(shownKey.replace(/\s+/g, '')),
      algorithm: 'SHA1',
      digits: 6,
      period: 30,
    }).toString();
    const expectedSvg = await QRCode.toString(keyUri, { type: 'svg', errorCorrectionLevel: 'M', margin: 2 });
    expect(Buffer.from(qrSource.slice(qrSource.indexOf(',') + 1), 'base64').toString('utf8')).toBe(expectedSvg);
    await picture('second-factor-enrolment');

    app = new AuthenticatorApp(shownKey);
    await page.getByRole('textbox', { name: 'One-time code' }).fill(await app.freshCode());
    await page.getByRole('button', { name: 'Switch on one-time codes' }).click();

    const codesPanel = page.getByRole('region', { name: 'Keep these recovery codes' });
    await codesPanel.getByRole('listitem').first().waitFor();
    recoveryCodes = (await codesPanel.getByRole('listitem').allInnerTexts()).map((text) => text.trim());
    expect(recoveryCodes).toHaveLength(RECOVERY_CODE_COUNT);
    for (const code of recoveryCodes) expect(code).toMatch(RECOVERY_CODE_FORMAT);
    expect(new Set(recoveryCodes).size).toBe(RECOVERY_CODE_COUNT);

    await codesPanel.getByRole('button', { name: 'I have kept them safe' }).click();
    await page.getByRole('heading', { level: 2, name: 'One-time codes are on' }).waitFor();
    await page.getByText(`${RECOVERY_CODE_COUNT} unused recovery codes left.`).waitFor();
    expect(errorAnswersSinceLastLook()).toEqual([]);
  });

  it('2. signing in asks for the code: a wrong one is refused with the server’s message, the right one opens Today', async () => {
    if (!app) throw new Error('Step 1 did not switch on one-time codes.');
    await signOut();
    await reachCodeStep();
    await picture('second-factor-code-step');

    await page.getByRole('textbox', { name: 'One-time code' }).fill(app.wrongCode());
    await page.getByRole('button', { name: 'Continue' }).click();
    await page.getByText(WRONG_CODE).waitFor();
    await expectCodeStillPending();
    await picture('second-factor-wrong-code');

    // The code that switched codes on used up its step: the app waits for the next one if needed.
    await page.getByRole('textbox', { name: 'One-time code' }).fill(await app.freshCode());
    await page.getByRole('button', { name: 'Continue' }).click();
    await expectToday();
    expect(errorAnswersSinceLastLook()).toEqual([VERIFY_REFUSED]);
  });

  it('3. a recovery code signs in once, and the same code is refused the second time', async () => {
    const [recoveryCode, anotherRecoveryCode] = recoveryCodes;
    if (!recoveryCode || !anotherRecoveryCode) throw new Error('Step 1 collected no recovery codes.');

    const signInWithRecoveryCode = async (code: string): Promise<void> => {
      await reachCodeStep();
      await page.getByRole('switch', { name: 'Use a recovery code instead' }).click();
      const field = page.getByRole('textbox', { name: 'Recovery code' });
      await field.fill(code);
      // All 34 characters stay in view on the sign-in card: the field does not scroll.
      await expect(field.evaluate((input: HTMLInputElement) => input.scrollWidth - input.clientWidth)).resolves.toBeLessThanOrEqual(0);
      await page.getByRole('button', { name: 'Continue' }).click();
    };

    await signOut();
    await signInWithRecoveryCode(recoveryCode);
    await expectToday();

    await signOut();
    await signInWithRecoveryCode(recoveryCode);
    await page.getByText(WRONG_RECOVERY_CODE).waitFor();
    await expectCodeStillPending();
    await picture('second-factor-recovery-code-refused');

    // The refusal is about that one code: another unused one still signs in.
    await page.getByRole('textbox', { name: 'Recovery code' }).fill(anotherRecoveryCode);
    await page.getByRole('button', { name: 'Continue' }).click();
    await expectToday();
    await page.goto(`${server.baseUrl}/account/security`);
    await page.getByText(`${RECOVERY_CODE_COUNT - 2} unused recovery codes left.`).waitFor();
    expect(errorAnswersSinceLastLook()).toEqual([VERIFY_REFUSED]);
  });

  it('4. the clinician changes their own password; the old one stops working and the new one still asks for the code', async () => {
    if (!app) throw new Error('Step 1 did not switch on one-time codes.');
    const newPassword = 'quiet-harbour-lantern-41';
    const panel = page.getByRole('region', { name: 'Your password' });
    await panel.waitFor();
    await panel.getByLabel('Current password').fill('not-my-password-at-all');
    await panel.getByLabel('New password', { exact: true }).fill(newPassword);
    await panel.getByLabel('New password again').fill(newPassword);
    await panel.getByRole('button', { name: 'Change password' }).click();
    await panel.getByText('This is not your current password.').waitFor();
    // That refusal is an expected 400 (checked exactly at the end, from the network); the browser logs it once as well.
    const logged = consoleProblems.findIndex((text) => /status of 400/.test(text));
    expect(logged).toBeGreaterThanOrEqual(0);
    consoleProblems.splice(logged, 1);

    await panel.getByLabel('Current password').fill(DEMO_PASSWORD);
    await panel.getByRole('button', { name: 'Change password' }).click();
    await panel.getByText(/^Password changed\. You had no other open sessions\./).waitFor();
    await expect(panel.getByLabel('Current password').inputValue()).resolves.toBe('');
    await picture('password-changed');

    await signOut();
    await submitSignIn(page, email);
    await page.getByRole('alert').filter({ hasText: /not right/ }).waitFor();
    await submitSignIn(page, email, newPassword);
    await page.getByRole('textbox', { name: 'One-time code' }).waitFor();
    await page.getByRole('textbox', { name: 'One-time code' }).fill(await app.freshCode());
    await page.getByRole('button', { name: 'Continue' }).click();
    await expectToday();
    expect(errorAnswersSinceLastLook()).toEqual(['400 POST /api/auth/password', '401 POST /api/auth/login']);
  });
});

import { Secret } from 'otpauth';
import { createTestApp, type TestApp } from '../../test/api/support/test-app';
import { totpCode } from '../auth/totp';
import { RecoveryCode } from '../entities/recovery-code.entity';
import { UserSecondFactor } from '../entities/user-second-factor.entity';
import { User } from '../entities/user.entity';
import { ENROLMENT_VALID_MS } from './second-factor.service';

/** A moment at the start of a 30-second step (epoch ms divisible by 30,000). */
const STEP_START = 58_920_000 * 30_000;
const STEP_MS = 30_000;

describe('SecondFactorService (fixed clock)', () => {
  let t: TestApp;
  let now = STEP_START;
  let partner: Express.User;

  beforeAll(async () => {
    t = await createTestApp({ secondFactor: 'required', clock: () => now });
  });
  afterAll(async () => {
    await t.close();
  });

  async function person(email: string): Promise<Express.User> {
    const row = await t.dataSource.getRepository(User).findOneByOrFail({ email });
    return { id: row.id, email: row.email, displayName: row.displayName, role: row.role };
  }

  /** Starts and confirms enrolment at the current clock; returns the raw secret and the recovery codes. */
  async function enrol(user: Express.User): Promise<{ secret: Uint8Array; recoveryCodes: string[] }> {
    const enrolment = await t.secondFactors.startEnrolment(user);
    const secret = Secret.fromBase32(enrolment.secret).bytes;
    const { recoveryCodes } = await t.secondFactors.confirmEnrolment(user, totpCode(secret, now));
    return { secret, recoveryCodes };
  }

  beforeEach(async () => {
    now = STEP_START;
    partner = await person('partner@example.org');
    await t.dataSource.getRepository(RecoveryCode).clear();
    await t.dataSource.getRepository(UserSecondFactor).clear();
  });

  it('moves a session from none to pending to verified as codes are switched on and checked', async () => {
    expect(await t.secondFactors.stateFor(partner, undefined)).toBe('none');
    await enrol(partner);
    const enabledAt = await t.secondFactors.enabledAt(partner.id);
    expect(enabledAt).toBe(STEP_START);
    expect(await t.secondFactors.stateFor(partner, undefined)).toBe('pending');
    expect(await t.secondFactors.stateFor(partner, STEP_START)).toBe('verified');
    // A session verified against an earlier set-up is pending again.
    expect(await t.secondFactors.stateFor(partner, STEP_START - 1)).toBe('pending');
  });

  it('requires enrolment of admins and audit leads only, under the required policy', async () => {
    expect(await t.secondFactors.stateFor(await person('admin@example.org'), undefined)).toBe('enrolment-required');
    expect(await t.secondFactors.stateFor(await person('lead@example.org'), undefined)).toBe('enrolment-required');
    expect(await t.secondFactors.stateFor(await person('clinician@example.org'), undefined)).toBe('none');
  });

  it('refuses the confirming code again in the same step (replay), then takes the next step once', async () => {
    const { secret } = await enrol(partner);
    await expect(t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now) })).rejects.toMatchObject({ status: 401, code: 'second_factor_invalid' });
    now += STEP_MS;
    const next = totpCode(secret, now);
    expect(await t.secondFactors.verify(partner.id, { method: 'one-time-code', code: next })).toBe(STEP_START);
    await expect(t.secondFactors.verify(partner.id, { method: 'one-time-code', code: next })).rejects.toMatchObject({ status: 401 });
  });

  it('takes a code one step old or one step ahead, never two, and never one older than the last used', async () => {
    const { secret } = await enrol(partner);
    now = STEP_START + 10 * STEP_MS;
    await expect(t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now - 2 * STEP_MS) })).rejects.toMatchObject({ status: 401 });
    await expect(t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now + 2 * STEP_MS) })).rejects.toMatchObject({ status: 401 });
    await t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now - STEP_MS) });
    await t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now + STEP_MS) });
    // Step now+1 was used, so the current step (earlier) is refused although inside the window.
    await expect(t.secondFactors.verify(partner.id, { method: 'one-time-code', code: totpCode(secret, now) })).rejects.toMatchObject({ status: 401 });
    const row = await t.dataSource.getRepository(UserSecondFactor).findOneByOrFail({ userId: partner.id });
    expect(row.lastUsedStep).toBe(STEP_START / STEP_MS + 11);
  });

  it('lets each recovery code in once, typed any way, and only its hash is stored', async () => {
    const { recoveryCodes } = await enrol(partner);
    const [first, second] = recoveryCodes;
    const stored = await t.dataSource.getRepository(RecoveryCode).findBy({ userId: partner.id });
    expect(stored).toHaveLength(10);
    expect(JSON.stringify(stored)).not.toContain(first.replace(/-/g, ''));
    await t.secondFactors.verify(partner.id, { method: 'recovery-code', code: first.toLowerCase().replace(/-/g, ' ') });
    await expect(t.secondFactors.verify(partner.id, { method: 'recovery-code', code: first })).rejects.toMatchObject({ status: 401 });
    await t.secondFactors.verify(partner.id, { method: 'recovery-code', code: second });
    expect((await t.secondFactors.status(partner)).recoveryCodesLeft).toBe(8);
  });

  it('stores the secret sealed, bound to its owner', async () => {
    const enrolment = await t.secondFactors.startEnrolment(partner);
    const pending = await t.dataSource.getRepository(UserSecondFactor).findOneByOrFail({ userId: partner.id });
    expect(pending.pendingSecretSealed).toMatch(/^v1\./);
    expect(JSON.stringify(pending)).not.toContain(enrolment.secret);
    // Moved to another person's row, it no longer opens: their confirmation fails instead of using it.
    const clinician = await person('clinician@example.org');
    await t.dataSource.getRepository(UserSecondFactor).save({ userId: clinician.id, pendingSecretSealed: pending.pendingSecretSealed, pendingSince: new Date(now), secretSealed: null, enabledAt: null, lastUsedStep: null });
    await expect(t.secondFactors.confirmEnrolment(clinician, totpCode(Secret.fromBase32(enrolment.secret).bytes, now))).rejects.toThrow();
  });

  it('lets an enrolment be confirmed for 15 minutes only', async () => {
    const enrolment = await t.secondFactors.startEnrolment(partner);
    now += ENROLMENT_VALID_MS + STEP_MS;
    const code = totpCode(Secret.fromBase32(enrolment.secret).bytes, now);
    await expect(t.secondFactors.confirmEnrolment(partner, code)).rejects.toMatchObject({ status: 409 });
  });

  it('replaces every recovery code on regeneration, and needs a fresh code for it', async () => {
    const { secret, recoveryCodes } = await enrol(partner);
    await expect(t.secondFactors.regenerateRecoveryCodes(partner, totpCode(secret, now))).rejects.toMatchObject({ status: 401 });
    now += STEP_MS;
    const fresh = await t.secondFactors.regenerateRecoveryCodes(partner, totpCode(secret, now));
    expect(fresh).toHaveLength(10);
    await expect(t.secondFactors.verify(partner.id, { method: 'recovery-code', code: recoveryCodes[0] })).rejects.toMatchObject({ status: 401 });
    await t.secondFactors.verify(partner.id, { method: 'recovery-code', code: fresh[0] });
  });

  it('switches codes off with a current code, but not for a role that must keep them', async () => {
    const { secret } = await enrol(partner);
    now += STEP_MS;
    await t.secondFactors.disable(partner, totpCode(secret, now), 'no-such-session');
    expect(await t.secondFactors.enabledAt(partner.id)).toBeNull();
    expect(await t.dataSource.getRepository(RecoveryCode).countBy({ userId: partner.id })).toBe(0);

    const lead = await person('lead@example.org');
    const leadEnabledAt = now;
    const leadFactor = await enrol(lead);
    now += STEP_MS;
    await expect(t.secondFactors.disable(lead, totpCode(leadFactor.secret, now), 'no-such-session')).rejects.toMatchObject({ status: 403 });
    expect(await t.secondFactors.enabledAt(lead.id)).toBe(leadEnabledAt);
  });
});

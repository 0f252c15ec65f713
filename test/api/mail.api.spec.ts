import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { SmtpStandIn } from '../../server/mail/smtp-stand-in';
import { MailMessage } from '../../server/entities/mail-message.entity';
import { isoWeek, RETRY_BACKOFF_MINUTES } from '../../server/services/mail.service';
import { caseBody, daysAgo } from './support/clinical-fixtures';
import { createTestApp, signedInAs, type TestApp } from './support/test-app';

// ISO 8601 week numbering (the week with the year's first Thursday is week 1) — from memory, checked by hand on a calendar.
describe('isoWeek', () => {
  it('numbers weeks as ISO 8601 does', () => {
    expect(isoWeek(new Date('2026-12-02T10:00:00Z'))).toBe('2026-W49');
    expect(isoWeek(new Date('2021-01-03T10:00:00Z'))).toBe('2020-W53');
    expect(isoWeek(new Date('2024-12-30T10:00:00Z'))).toBe('2025-W01');
  });
});

/** The decoded text of a captured message (bodies arrive quoted-printable, RFC 2045 §6.7). */
function textOf(raw: string | undefined): string {
  return (raw ?? '').replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/g, (_match, hex: string) => String.fromCharCode(parseInt(hex, 16)));
}

describe('mail through the local SMTP stand-in', () => {
  let standIn: SmtpStandIn;
  let outbox: string;
  let t: TestApp;

  beforeAll(async () => {
    outbox = mkdtempSync(path.join(tmpdir(), 'tidemark-outbox-'));
    standIn = new SmtpStandIn(outbox);
    const port = await standIn.start(0);
    t = await createTestApp({ mailTransport: nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true }) });
  });
  afterAll(async () => {
    await t.close();
    await standIn.stop();
    rmSync(outbox, { recursive: true, force: true });
  });

  async function auditWithCycle() {
    const lead = await signedInAs(t.app, 'audit_lead');
    const schedules = (await lead.get('/api/schedules')).body as { id: number }[];
    const audit = await lead.post('/api/audits', { title: 'Mail audit', scheduleId: schedules[0].id });
    expect(audit.status).toBe(201);
    const cycle = await lead.post(`/api/audits/${audit.body.id}/cycles`, { periodStart: '2025-01-01', periodEnd: '2025-12-31' });
    return { lead, auditId: audit.body.id as number, cycleId: cycle.body.id as number };
  }

  it('sends "governance pack ready" to the committee with a sign-in link and no patient data', async () => {
    const { lead, auditId, cycleId } = await auditWithCycle();
    const clinician = await signedInAs(t.app, 'clinician');
    const me = (await clinician.get('/api/auth/me')).body.user.id as number;
    const created = await clinician.post('/api/cases', caseBody(me, { patient: { code: 'MAIL-0001', birthYear: 1980, sex: 'female', smoking: 'never', diabetes: 'none', phenotype: 'thin', phenotypeMethod: 'visual' } }));
    expect(created.status).toBe(201);
    const response = await lead.post(`/api/audits/${auditId}/send-pack`, { cycleId });
    expect(response.status).toBe(202);
    expect(response.body).toEqual({ queued: 1 });
    const captured = await standIn.list();
    const pack = captured.find((mail) => mail.to.includes('governance@example.org'));
    expect(pack).toBeDefined();
    expect(textOf(pack?.raw)).toMatch(/governance pack/i);
    // The link opens Reports on this audit and cycle (shared/types/reports-link.ts).
    expect(textOf(pack?.raw)).toContain(`http://localhost:3000/reports?audit=${auditId}&cycle=${cycleId}`);
    expect(textOf(pack?.raw)).not.toMatch(/MAIL-0001/);
    expect(captured.every((mail) => !mail.to.includes('clinician@example.org'))).toBe(true);
  });

  it('lets only the audit lead send the pack', async () => {
    const { auditId } = await auditWithCycle();
    for (const role of ['partner', 'governance', 'clinician', 'admin'] as const) {
      const client = await signedInAs(t.app, role);
      expect((await client.post(`/api/audits/${auditId}/send-pack`, {})).status).toBe(403);
    }
  });

  it('sends each clinician a weekly digest of due recalls once per week, with counts only', async () => {
    const clinician = await signedInAs(t.app, 'clinician');
    const me = (await clinician.get('/api/auth/me')).body.user.id as number;
    // Surgery 40 days ago: the 6-week recall (day 42, window −7/+14) is in its window today.
    const created = await clinician.post('/api/cases', caseBody(me, { surgeryDate: daysAgo(40), status: 'operated', patient: { code: 'MAIL-0002', birthYear: 1975, sex: 'male', smoking: 'never', diabetes: 'none', phenotype: 'thick', phenotypeMethod: 'visual' } }));
    expect(created.status).toBe(201);
    const admin = await signedInAs(t.app, 'admin');
    const first = await admin.post('/api/outbox/run');
    expect(first.status).toBe(200);
    expect(first.body.digests).toBeGreaterThanOrEqual(1);
    const second = await admin.post('/api/outbox/run');
    expect(second.body.digests).toBe(0);
    const digest = (await standIn.list()).find((mail) => mail.to.includes('clinician@example.org') && /recalls/.test(mail.raw));
    expect(textOf(digest?.raw)).toMatch(/inside their window/);
    expect(textOf(digest?.raw)).not.toMatch(/MAIL-0002/);
  });

  it('reminds an action owner when the due date is near', async () => {
    const { lead, cycleId } = await auditWithCycle();
    const partnerId = (await (await signedInAs(t.app, 'partner')).get('/api/auth/me')).body.user.id as number;
    const due = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
    expect((await lead.post(`/api/cycles/${cycleId}/actions`, { action: 'Review stent technique', ownerId: partnerId, dueDate: due })).status).toBe(201);
    const admin = await signedInAs(t.app, 'admin');
    expect((await admin.post('/api/outbox/run')).body.reminders).toBeGreaterThanOrEqual(1);
    const reminder = (await standIn.list()).find((mail) => mail.to.includes('partner@example.org'));
    expect(textOf(reminder?.raw)).toMatch(/Review stent technique/);
  });

  it('shows the queue to admins only', async () => {
    const admin = await signedInAs(t.app, 'admin');
    const list = await admin.get('/api/outbox');
    expect(list.status).toBe(200);
    expect(list.body.length).toBeGreaterThan(0);
    expect(list.body.every((entry: { status: string }) => entry.status === 'sent')).toBe(true);
    for (const role of ['audit_lead', 'partner', 'governance', 'clinician'] as const) {
      expect((await (await signedInAs(t.app, role)).get('/api/outbox')).status).toBe(403);
    }
  });
});

describe('failed sends', () => {
  it('are retried with backoff, marked failed after the last try, and can be retried by an admin', async () => {
    // Port 1 on loopback refuses connections: every send fails.
    const t = await createTestApp({ mailTransport: nodemailer.createTransport({ host: '127.0.0.1', port: 1, secure: false, ignoreTLS: true, connectionTimeout: 2000 }) });
    try {
      const mail = t.services.mail;
      const start = new Date('2026-01-05T09:00:00Z');
      expect(await mail.enqueue('recall-digest', 'clinician@example.org', 'Test', 'Body', null, start)).toBe(true);
      let now = start;
      for (const minutes of RETRY_BACKOFF_MINUTES) {
        expect(await mail.deliverDue(now)).toEqual({ sent: 0, failed: 0, retrying: 1 });
        // Nothing is due before the backoff has passed.
        expect(await mail.deliverDue(new Date(now.getTime() + (minutes * 60_000) / 2))).toEqual({ sent: 0, failed: 0, retrying: 0 });
        now = new Date(now.getTime() + minutes * 60_000);
      }
      expect(await mail.deliverDue(now)).toEqual({ sent: 0, failed: 1, retrying: 0 });
      const row = await t.dataSource.getRepository(MailMessage).findOneByOrFail({ subject: 'Test' });
      expect(row.status).toBe('failed');
      expect(row.attempts).toBe(RETRY_BACKOFF_MINUTES.length + 1);
      expect(row.lastError).toBeTruthy();
      const admin = await signedInAs(t.app, 'admin');
      const listed = (await admin.get('/api/outbox')).body as { id: number; status: string; lastError: string }[];
      expect(listed.find((entry) => entry.id === row.id)?.status).toBe('failed');
      const retried = await admin.post(`/api/outbox/${row.id}/retry`);
      expect(retried.status).toBe(200);
      expect(retried.body.status).toBe('queued');
    } finally {
      await t.close();
    }
  });
});

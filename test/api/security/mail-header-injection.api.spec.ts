import nodemailer, { type SendMailOptions } from 'nodemailer';
import type { AuditView } from '@tidemark/shared';
import { MailMessage } from '../../../server/entities/mail-message.entity';
import { auditBody, defaultScheduleId } from '../support/audit-fixtures';
import { expectStatus } from '../support/clinical-fixtures';
import { createTestApp, signedInAs, type TestApp } from '../support/test-app';

/*
 * No SMTP header injection (OWASP ASVS 5.0 1.3.11). An audit title is free text of up to 160
 * characters and may hold line breaks; it becomes the subject of "governance pack ready". The
 * message is built by nodemailer's stream transport (the same MIME builder the SMTP transport
 * uses), so the bytes checked here are the bytes a mail server would receive.
 */

/** Header lines an attacker would like to add, after a CR/LF in the title. */
const INJECTED = ['Bcc: intruder@example.org', 'X-Injected: yes'];
const TITLE = `Papilla audit\r\n${INJECTED[0]}\r\n${INJECTED[1]}\nReply-To: intruder@example.org\r\n\r\nA body of our own`;

/** The header block of an RFC 5322 message, unfolded (a CRLF followed by white space continues the line, §2.2.3), one header per entry. */
function headersOf(raw: string): string[] {
  const end = raw.indexOf('\r\n\r\n');
  expect(end).toBeGreaterThan(0);
  return raw
    .slice(0, end)
    .replace(/\r\n[ \t]/g, ' ')
    .split('\r\n');
}

/** RFC 2047 encoded words (`=?UTF-8?Q?…?=` and `=?UTF-8?B?…?=`) decoded, so the subject reads as sent. */
function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?UTF-8\?([QB])\?([^?]*)\?=/gi, (_match, encoding: string, text: string) =>
      encoding.toUpperCase() === 'B' ? Buffer.from(text, 'base64').toString('utf8') : Buffer.from(text.replace(/_/g, ' ').replace(/=([0-9A-F]{2})/gi, (_hex, byte: string) => String.fromCharCode(parseInt(byte, 16))), 'latin1').toString('utf8'),
    );
}

describe('mail: an audit title with CR/LF cannot add headers (ASVS 5.0 1.3.11)', () => {
  let t: TestApp;
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
  const sent: Buffer[] = [];

  beforeAll(async () => {
    const sendMail = transport.sendMail.bind(transport);
    // Keep every built message: the stream transport answers with the raw bytes.
    vi.spyOn(transport, 'sendMail').mockImplementation(async (mail: SendMailOptions) => {
      const info = await sendMail(mail);
      sent.push(info.message as Buffer);
      return info;
    });
    t = await createTestApp({ mailTransport: transport });
  });
  afterAll(async () => {
    vi.restoreAllMocks();
    await t.close();
  });

  it('keeps the title, line breaks and all, inside one Subject header; no Bcc, Reply-To or other header appears', async () => {
    const lead = await signedInAs(t.app, 'audit_lead');
    const audit = expectStatus(await lead.post('/api/audits', auditBody(await defaultScheduleId(lead), { title: TITLE })), 201).body as AuditView;
    // The title is stored as typed (only its ends are trimmed): the defence is at the mail, not in the data.
    expect(audit.title).toBe(TITLE);
    expectStatus(await lead.post(`/api/audits/${audit.id}/send-pack`, { cycleId: null }), 202);

    const row = await t.dataSource.getRepository(MailMessage).findOneByOrFail({ kind: 'governance-pack' });
    expect(row.status).toBe('sent');
    expect(sent).toHaveLength(1);
    const raw = sent[0].toString('utf8');
    const headers = headersOf(raw);
    const names = headers.map((line) => line.slice(0, line.indexOf(':')).toLowerCase());
    expect(names.filter((name) => name === 'subject')).toHaveLength(1);
    expect(names).not.toContain('bcc');
    expect(names).not.toContain('x-injected');
    expect(names).not.toContain('reply-to');
    expect(names.filter((name) => name === 'to')).toHaveLength(1);
    expect(headers.find((line) => line.toLowerCase().startsWith('to:'))).toBe('To: governance@example.org');

    // The injected text is still there, harmlessly, as words of the one subject line.
    const subject = decodeWords(headers.find((line) => line.toLowerCase().startsWith('subject:'))?.slice('subject:'.length).trim() ?? '');
    expect(subject).toMatch(/^Tidemark: governance pack ready — Papilla audit\s+Bcc: intruder@example\.org\s+X-Injected: yes\s+Reply-To: intruder@example\.org\s+A body of our own$/);
    expect(subject).not.toMatch(/[\r\n]/);
  });
});

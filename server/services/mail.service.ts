import type { Transporter } from 'nodemailer';
import { reportsLinkPath } from '@tidemark/shared';
import type { DataSource } from 'typeorm';
import { In, LessThanOrEqual } from 'typeorm';
import { ActionItem } from '../entities/action-item.entity';
import type { Audit } from '../entities/audit.entity';
import { AuditCycle } from '../entities/audit-cycle.entity';
import { Audit as AuditEntity } from '../entities/audit.entity';
import { MailMessage, type MailKind } from '../entities/mail-message.entity';
import { User } from '../entities/user.entity';
import { HttpError } from '../http-error';
import type { RecallService } from './recall.service';
import { isUniqueViolation } from './unique-violation';

/** Minutes to wait before each retry; after the last one the message is marked failed. */
export const RETRY_BACKOFF_MINUTES = [1, 5, 15, 60];
/** Days before an action's due date when its owner is reminded. */
export const ACTION_REMINDER_DAYS = 7;

/** A row of the Outbox page. */
export interface OutboxEntry {
  id: number;
  kind: MailKind;
  to: string;
  subject: string;
  body: string;
  status: MailMessage['status'];
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  sentAt: string | null;
  createdAt: string;
}

function mapEntry(message: MailMessage): OutboxEntry {
  const iso = (value: Date | null) => (value ? new Date(value).toISOString() : null);
  return {
    id: message.id,
    kind: message.kind,
    to: message.toAddress,
    subject: message.subject,
    body: message.body,
    status: message.status,
    attempts: message.attempts,
    lastError: message.lastError,
    nextAttemptAt: iso(message.nextAttemptAt),
    sentAt: iso(message.sentAt),
    createdAt: new Date(message.createdAt).toISOString(),
  };
}

/** ISO 8601 week label, e.g. 2026-W49 (weeks start on Monday; week 1 holds the first Thursday). */
export function isoWeek(date: Date): string {
  const day = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate()));
  const weekday = day.getUTCDay() || 7;
  day.setUTCDate(day.getUTCDate() + 4 - weekday);
  const yearStart = new Date(Date.UTC(day.getUTCFullYear(), 0, 1));
  const week = Math.ceil(((day.getTime() - yearStart.getTime()) / 86_400_000 + 1) / 7);
  return `${day.getUTCFullYear()}-W${String(week).padStart(2, '0')}`;
}

/**
 * Outgoing e-mail: a queue in the database, delivered over SMTP with retries. Messages
 * point people to sign in; they never carry patient codes, measurements or notes.
 */
export class MailService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly transport: Transporter,
    private readonly options: { from: string; appUrl: string },
    private readonly recalls: RecallService,
  ) {}

  /** Queues one message; a repeated dedupe key is ignored (scheduled messages go out once). */
  async enqueue(kind: MailKind, to: string, subject: string, body: string, dedupeKey: string | null = null, now = new Date()): Promise<boolean> {
    const repository = this.dataSource.getRepository(MailMessage);
    if (dedupeKey && (await repository.existsBy({ dedupeKey }))) return false;
    try {
      await repository.insert({ kind, toAddress: to, subject, body, status: 'queued', attempts: 0, lastError: null, nextAttemptAt: now, sentAt: null, messageId: null, dedupeKey });
    } catch (error) {
      // Another run (a second app server on PostgreSQL) queued the same key between the check and the insert: it goes out once.
      if (dedupeKey && isUniqueViolation(error)) return false;
      throw error;
    }
    return true;
  }

  /** Sends what is due; failures are retried with backoff and end as 'failed'. Returns counts. */
  async deliverDue(now = new Date()): Promise<{ sent: number; failed: number; retrying: number }> {
    const repository = this.dataSource.getRepository(MailMessage);
    const due = await repository.find({ where: { status: 'queued', nextAttemptAt: LessThanOrEqual(now) }, order: { id: 'ASC' }, take: 50 });
    const counts = { sent: 0, failed: 0, retrying: 0 };
    for (const message of due) {
      try {
        const info = await this.transport.sendMail({ from: this.options.from, to: message.toAddress, subject: message.subject, text: message.body });
        await repository.update({ id: message.id }, { status: 'sent', attempts: message.attempts + 1, sentAt: now, lastError: null, nextAttemptAt: null, messageId: String(info.messageId ?? '') });
        counts.sent++;
      } catch (error) {
        // A failed send is kept with its reason and retried later; the Outbox shows it.
        const attempts = message.attempts + 1;
        const backoff = RETRY_BACKOFF_MINUTES[attempts - 1];
        const lastError = error instanceof Error ? error.message.slice(0, 500) : 'Unknown error';
        if (backoff === undefined) {
          await repository.update({ id: message.id }, { status: 'failed', attempts, lastError, nextAttemptAt: null });
          counts.failed++;
        } else {
          await repository.update({ id: message.id }, { attempts, lastError, nextAttemptAt: new Date(now.getTime() + backoff * 60_000) });
          counts.retrying++;
        }
      }
    }
    return counts;
  }

  async list(user: Express.User): Promise<OutboxEntry[]> {
    this.assertAdmin(user);
    return (await this.dataSource.getRepository(MailMessage).find({ order: { createdAt: 'DESC', id: 'DESC' }, take: 500 })).map(mapEntry);
  }

  async retry(user: Express.User, id: number, now = new Date()): Promise<OutboxEntry> {
    this.assertAdmin(user);
    const repository = this.dataSource.getRepository(MailMessage);
    const message = await repository.findOneBy({ id });
    if (!message) throw HttpError.notFound('The message');
    if (message.status === 'sent') throw HttpError.conflict('This message was already sent.');
    await repository.update({ id }, { status: 'queued', nextAttemptAt: now });
    return mapEntry(await repository.findOneByOrFail({ id }));
  }

  /**
   * Tells a member their password was just changed, so a change they did not make is noticed
   * (common practice). Says nothing of the password itself.
   */
  async queuePasswordChangedNotice(member: { email: string; displayName: string }, endedSessions: number, now = new Date()): Promise<void> {
    await this.enqueue(
      'password-changed',
      member.email,
      'Tidemark: your password was changed',
      [
        `Dear ${member.displayName},`,
        '',
        `The password of your Tidemark account was changed on ${now.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
        endedSessions === 0 ? 'You had no other open sessions.' : `Your ${endedSessions === 1 ? 'other open session was' : `${endedSessions} other open sessions were`} signed out.`,
        '',
        'If you did not make this change, tell your practice administrator at once: they can set a new password and reset your sign-in protection.',
        `Sign in: ${this.options.appUrl}/sign-in`,
      ].join('\n'),
      null,
      now,
    );
  }

  /** "Governance pack ready" to every active governance member: a link, never patient data. */
  async queueGovernancePack(user: Express.User, auditId: number, cycleId: number | null): Promise<{ queued: number }> {
    if (user.role !== 'audit_lead') throw HttpError.forbidden('The audit lead sends the governance pack.');
    const audit: Audit | null = await this.dataSource.getRepository(AuditEntity).findOneBy({ id: auditId });
    if (!audit) throw HttpError.notFound('The audit');
    let cycleLabel = 'live results';
    if (cycleId !== null) {
      const cycle = await this.dataSource.getRepository(AuditCycle).findOneBy({ id: cycleId, auditId });
      if (!cycle) throw HttpError.notFound('The audit cycle');
      cycleLabel = `cycle ${cycle.number}`;
    }
    const members = await this.dataSource.getRepository(User).findBy({ role: 'governance', active: true });
    for (const member of members) {
      await this.enqueue(
        'governance-pack',
        member.email,
        `Tidemark: governance pack ready — ${audit.title}`,
        [
          `Dear ${member.displayName},`,
          '',
          `The governance pack for the audit "${audit.title}" (${cycleLabel}) is ready.`,
          `Sign in to download it: ${this.options.appUrl}${reportsLinkPath(auditId, cycleId)}`,
          '',
          'The workbook holds de-identified results only. For clinical audit and quality improvement; not a diagnostic tool.',
        ].join('\n'),
      );
    }
    return { queued: members.length };
  }

  /** The weekly digest of due and overdue recalls, once per clinician per ISO week; counts only. */
  async queueRecallDigests(now = new Date()): Promise<number> {
    const clinicians = await this.dataSource.getRepository(User).findBy({ role: In(['clinician', 'audit_lead']), active: true });
    const week = isoWeek(now);
    let queued = 0;
    for (const clinician of clinicians) {
      const due = await this.recalls.due({ id: clinician.id, email: clinician.email, displayName: clinician.displayName, role: 'clinician' }, now.toISOString().slice(0, 10));
      if (due.inWindow.length === 0 && due.overdue.length === 0) continue;
      const isNew = await this.enqueue(
        'recall-digest',
        clinician.email,
        `Tidemark: ${due.inWindow.length} recalls in their window, ${due.overdue.length} overdue`,
        [
          `Dear ${clinician.displayName},`,
          '',
          `This week ${due.inWindow.length} of your recalls are inside their window and ${due.overdue.length} are overdue; ${due.upcoming.length} open in the next 14 days.`,
          `Sign in to see them: ${this.options.appUrl}/today`,
        ].join('\n'),
        `digest:${clinician.id}:${week}`,
        now,
      );
      if (isNew) queued++;
    }
    return queued;
  }

  /** Reminds owners of open actions due within {@link ACTION_REMINDER_DAYS} days, once per action and due date. */
  async queueActionReminders(now = new Date()): Promise<number> {
    const today = now.toISOString().slice(0, 10);
    const horizon = new Date(now.getTime() + ACTION_REMINDER_DAYS * 86_400_000).toISOString().slice(0, 10);
    const actions = await this.dataSource
      .getRepository(ActionItem)
      .createQueryBuilder('a')
      .where("a.state IN ('open', 'under-way')")
      .andWhere('a.due_date <= :horizon', { horizon })
      .getMany();
    let queued = 0;
    for (const action of actions) {
      const owner = await this.dataSource.getRepository(User).findOneBy({ id: action.ownerId, active: true });
      const cycle = await this.dataSource.getRepository(AuditCycle).findOneBy({ id: action.cycleId });
      const audit = cycle ? await this.dataSource.getRepository(AuditEntity).findOneBy({ id: cycle.auditId }) : null;
      if (!owner || !cycle || !audit) continue;
      const isOverdue = action.dueDate < today;
      const isNew = await this.enqueue(
        'action-reminder',
        owner.email,
        `Tidemark: action ${isOverdue ? 'overdue' : 'due'} on ${action.dueDate}`,
        [
          `Dear ${owner.displayName},`,
          '',
          `An action from the audit "${audit.title}" (cycle ${cycle.number}) is ${isOverdue ? 'overdue since' : 'due on'} ${action.dueDate}:`,
          `  ${action.action}`,
          `Sign in to update it: ${this.options.appUrl}/audits/${audit.id}?area=cycles`,
        ].join('\n'),
        `action:${action.id}:${action.dueDate}`,
        now,
      );
      if (isNew) queued++;
    }
    return queued;
  }

  /** Queues the scheduled messages and delivers what is due (run hourly, and by the admin on demand). */
  async runSchedules(now = new Date()): Promise<{ digests: number; reminders: number; sent: number; failed: number; retrying: number }> {
    const digests = await this.queueRecallDigests(now);
    const reminders = await this.queueActionReminders(now);
    return { digests, reminders, ...(await this.deliverDue(now)) };
  }

  private assertAdmin(user: Express.User): void {
    if (user.role !== 'admin') throw HttpError.forbidden('The Outbox is for administrators.');
  }
}

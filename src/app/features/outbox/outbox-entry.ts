/** Kinds of message Tidemark sends (server `MailKind`). */
export type OutboxKind = 'governance-pack' | 'recall-digest' | 'action-reminder' | 'password-changed';

/** Where a message stands in the queue. */
export type OutboxStatus = 'queued' | 'sent' | 'failed';

/** One message of the Outbox (`GET /api/outbox`). */
export interface OutboxEntry {
  readonly id: number;
  readonly kind: OutboxKind;
  readonly to: string;
  readonly subject: string;
  readonly body: string;
  readonly status: OutboxStatus;
  readonly attempts: number;
  readonly lastError: string | null;
  readonly nextAttemptAt: string | null;
  readonly sentAt: string | null;
  readonly createdAt: string;
}

/** What "Run the mail schedules now" did (`POST /api/outbox/run`). */
export interface ScheduleRun {
  readonly digests: number;
  readonly reminders: number;
  readonly sent: number;
  readonly failed: number;
  readonly retrying: number;
}

/** Our names for the kinds of message. */
export const OUTBOX_KIND_LABELS: Readonly<Record<OutboxKind, string>> = {
  'governance-pack': 'Committee pack notice',
  'recall-digest': 'Weekly recall round-up',
  'action-reminder': 'Action plan nudge',
  'password-changed': 'Password change notice',
};

/** Whether an administrator may send the message again now. */
export function canRetry(entry: OutboxEntry): boolean {
  return entry.status !== 'sent';
}

/** The outcome of a schedule run in one sentence. */
export function describeScheduleRun(run: ScheduleRun): string {
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  return [
    `Queued ${count(run.digests, 'recall round-up', 'recall round-ups')} and ${count(run.reminders, 'action nudge', 'action nudges')}.`,
    `Delivered ${run.sent}, ${run.retrying} waiting to retry, ${run.failed} failed.`,
  ].join(' ');
}

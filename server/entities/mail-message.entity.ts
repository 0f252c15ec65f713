import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/** Kinds of messages Tidemark sends. */
export type MailKind = 'governance-pack' | 'recall-digest' | 'action-reminder' | 'password-changed';
/** Delivery state: queued → sent, or failed after the last retry. */
export type MailStatus = 'queued' | 'sent' | 'failed';

/** One outgoing e-mail and its delivery attempts. Never carries patient data. */
@Entity('mail_message')
@Index('IDX_mail_status_next', ['status', 'nextAttemptAt'])
export class MailMessage {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('varchar', { length: 24 })
  kind!: MailKind;

  @Column('varchar', { name: 'to_address', length: 254 })
  toAddress!: string;

  @Column('varchar', { length: 200 })
  subject!: string;

  @Column('text')
  body!: string;

  @Column('varchar', { length: 8 })
  status!: MailStatus;

  @Column('integer', { default: 0 })
  attempts!: number;

  @Column('text', { name: 'last_error', nullable: true })
  lastError!: string | null;

  @Column({ type: TIMESTAMP_TYPE, name: 'next_attempt_at', nullable: true })
  nextAttemptAt!: Date | null;

  @Column({ type: TIMESTAMP_TYPE, name: 'sent_at', nullable: true })
  sentAt!: Date | null;

  /** SMTP message id, to find the captured copy in the stand-in outbox. */
  @Column('varchar', { name: 'message_id', length: 200, nullable: true })
  messageId!: string | null;

  /** Makes scheduled messages idempotent, e.g. `digest:7:2026-W49` or `action:12`. */
  @Index('UQ_mail_dedupe', { unique: true })
  @Column('varchar', { name: 'dedupe_key', length: 80, nullable: true })
  dedupeKey!: string | null;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;
}

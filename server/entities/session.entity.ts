import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** A server-side session row for express-session (see auth/session-store.ts). */
@Entity('session')
export class SessionRow {
  @PrimaryColumn('varchar', { length: 128 })
  sid!: string;

  /** Serialised express-session data (JSON). */
  @Column('text')
  data!: string;

  /** Epoch milliseconds after which the row is dead. */
  @Index('IDX_session_expires_at')
  @Column('bigint', { name: 'expires_at' })
  expiresAt!: number;

  /** Set once someone signs in, so deactivating a user can end their sessions. */
  @Index('IDX_session_user_id')
  @Column('integer', { name: 'user_id', nullable: true })
  userId!: number | null;
}

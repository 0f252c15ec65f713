import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** A server-side session row for express-session (see auth/session-store.ts). */
@Entity('session')
export class SessionRow {
  @PrimaryColumn('varchar', { length: 128 })
  sid!: string;

  /** Serialised express-session data (JSON). */
  @Column('text')
  data!: string;

  /**
   * Epoch milliseconds after which the row is dead. PostgreSQL's driver returns bigint as a
   * string (it may exceed 2^53); epoch milliseconds stay far below, so read it as a number.
   */
  @Index('IDX_session_expires_at')
  @Column('bigint', { name: 'expires_at', transformer: { to: (value: number) => value, from: (value: string | number) => Number(value) } })
  expiresAt!: number;

  /** Set once someone signs in, so deactivating a user can end their sessions. */
  @Index('IDX_session_user_id')
  @Column('integer', { name: 'user_id', nullable: true })
  userId!: number | null;
}

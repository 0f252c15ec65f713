import { Column, Entity, PrimaryColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/**
 * A person's one-time-code (TOTP, RFC 6238) set-up: at most one row per user.
 * Secrets are stored sealed with AES-256-GCM (auth/secret-box.ts), never in plain.
 */
@Entity('user_second_factor')
export class UserSecondFactor {
  @PrimaryColumn('integer', { name: 'user_id' })
  userId!: number;

  /** The confirmed secret, sealed; null while only an enrolment is pending. */
  @Column('varchar', { name: 'secret_sealed', length: 200, nullable: true })
  secretSealed!: string | null;

  /** When the confirmed secret was switched on; null when one-time codes are off. */
  @Column({ type: TIMESTAMP_TYPE, name: 'enabled_at', nullable: true })
  enabledAt!: Date | null;

  /** The last time step (RFC 6238 "T") whose code was accepted: no code of that step or earlier works again. */
  @Column('integer', { name: 'last_used_step', nullable: true })
  lastUsedStep!: number | null;

  /** A secret handed out for enrolment but not yet confirmed with a code, sealed. */
  @Column('varchar', { name: 'pending_secret_sealed', length: 200, nullable: true })
  pendingSecretSealed!: string | null;

  /** When the pending secret was handed out (it expires after a while). */
  @Column({ type: TIMESTAMP_TYPE, name: 'pending_since', nullable: true })
  pendingSince!: Date | null;
}

import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/** One single-use recovery code, stored as its SHA-256 (auth/recovery-codes.ts says why that suffices). */
@Entity('recovery_code')
export class RecoveryCode {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_recovery_code_user')
  @Column('integer', { name: 'user_id' })
  userId!: number;

  /** Hex SHA-256 of the canonical code. */
  @Column('varchar', { name: 'code_hash', length: 64 })
  codeHash!: string;

  /** When it was used to sign in; a used code never works again. */
  @Column({ type: TIMESTAMP_TYPE, name: 'used_at', nullable: true })
  usedAt!: Date | null;

  @Column({ type: TIMESTAMP_TYPE, name: 'created_at' })
  createdAt!: Date;
}

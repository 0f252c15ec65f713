import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** A person who signs in. E-mail is stored lower-cased, so uniqueness is case-insensitive. */
@Entity('user')
export class User {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('UQ_user_email', { unique: true })
  @Column('varchar', { length: 254 })
  email!: string;

  @Column('varchar', { name: 'display_name', length: 120 })
  displayName!: string;

  @Column('varchar', { length: 20 })
  role!: Role;

  @Column('boolean', { default: true })
  active!: boolean;

  /** `scrypt$N$r$p$salt$hash` (base64 salt and hash). */
  @Column('varchar', { name: 'password_hash', length: 255 })
  passwordHash!: string;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column({ type: TIMESTAMP_TYPE, name: 'last_sign_in_at', nullable: true })
  lastSignInAt!: Date | null;
}

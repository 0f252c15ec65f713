import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/** A partner's or the lead's comment on a result. */
@Entity('review_note')
export class ReviewNote {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_note_audit')
  @Column('integer', { name: 'audit_id' })
  auditId!: number;

  @Column('integer', { name: 'cycle_id', nullable: true })
  cycleId!: number | null;

  @Column('varchar', { length: 60 })
  topic!: string;

  @Column('text')
  text!: string;

  @Column('integer', { name: 'author_id' })
  authorId!: number;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;
}

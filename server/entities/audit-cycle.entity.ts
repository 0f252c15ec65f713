import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { CycleState } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** One round of an audit (the first audit or a re-audit), with its frozen results once reported. */
@Entity('audit_cycle')
@Index('UQ_cycle_audit_number', ['auditId', 'number'], { unique: true })
export class AuditCycle {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('integer', { name: 'audit_id' })
  auditId!: number;

  @Column('integer')
  number!: number;

  @Column('varchar', { name: 'period_start', length: 10 })
  periodStart!: string;

  @Column('varchar', { name: 'period_end', length: 10 })
  periodEnd!: string;

  @Column('varchar', { length: 12 })
  state!: CycleState;

  @Column({ type: TIMESTAMP_TYPE, name: 'frozen_at', nullable: true })
  frozenAt!: Date | null;

  /** JSON of the frozen AuditSnapshot (dataset and standards as they were). */
  @Column('text', { nullable: true })
  snapshot!: string | null;

  @Column('varchar', { name: 'presented_date', length: 10, nullable: true })
  presentedDate!: string | null;

  @Column('text', { default: '' })
  notes!: string;

  @Column('integer', { default: 1 })
  version!: number;
}

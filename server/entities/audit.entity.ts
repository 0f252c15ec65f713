import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { CohortDefinition } from '@tidemark/shared';
import { FLOAT_TYPE, TIMESTAMP_TYPE } from './column-types';

/** An audit: topic, cohort, schedule and stability thresholds. */
@Entity('audit')
export class Audit {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('varchar', { length: 160 })
  title!: string;

  @Column('text', { default: '' })
  rationale!: string;

  @Column('integer', { name: 'lead_id' })
  leadId!: number;

  @Column('integer', { name: 'schedule_id' })
  scheduleId!: number;

  @Column(FLOAT_TYPE, { name: 'stable_threshold' })
  stableThreshold!: number;

  @Column(FLOAT_TYPE, { name: 'relapse_threshold' })
  relapseThreshold!: number;

  /** Cohort filters (shared cohortSchema), stored as JSON. */
  @Column('simple-json')
  cohort!: CohortDefinition;

  @Column('varchar', { name: 'reaudit_date', length: 10, nullable: true })
  reauditDate!: string | null;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

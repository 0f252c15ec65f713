import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { CaseStatus, Indication, Instrument, Procedure } from '@tidemark/shared';
import { FLOAT_TYPE, TIMESTAMP_TYPE } from './column-types';

/** One crown-lengthening case: a patient, an operator, a surgery date and its sites. */
@Entity('surgical_case')
export class SurgicalCase {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_case_patient')
  @Column('integer', { name: 'patient_id' })
  patientId!: number;

  @Index('IDX_case_operator')
  @Column('integer', { name: 'operator_id' })
  operatorId!: number;

  /** ISO date YYYY-MM-DD. */
  @Index('IDX_case_surgery_date')
  @Column('varchar', { name: 'surgery_date', length: 10 })
  surgeryDate!: string;

  @Column('varchar', { length: 32 })
  procedure!: Procedure;

  @Column('varchar', { length: 32 })
  indication!: Indication;

  @Column('varchar', { length: 16 })
  instrument!: Instrument;

  @Column('boolean', { name: 'hygiene_phase_complete', default: false })
  hygienePhaseComplete!: boolean;

  @Column(FLOAT_TYPE, { name: 'bleeding_score_pct', nullable: true })
  bleedingScorePct!: number | null;

  @Column(FLOAT_TYPE, { name: 'plaque_score_pct', nullable: true })
  plaqueScorePct!: number | null;

  @Column(FLOAT_TYPE, { name: 'deepest_probing_mm', nullable: true })
  deepestProbingMm!: number | null;

  @Column('boolean', { name: 'suture_resorbable', nullable: true })
  sutureResorbable!: boolean | null;

  @Column('varchar', { name: 'suture_size', length: 8, nullable: true })
  sutureSize!: string | null;

  @Column('boolean', { name: 'provisional_restorations', default: false })
  provisionalRestorations!: boolean;

  @Column('text', { name: 'intra_operative_events', default: '' })
  intraOperativeEvents!: string;

  @Column('varchar', { name: 'final_impression_date', length: 10, nullable: true })
  finalImpressionDate!: string | null;

  @Column('varchar', { name: 'final_restoration_date', length: 10, nullable: true })
  finalRestorationDate!: string | null;

  @Index('IDX_case_status')
  @Column('varchar', { length: 16 })
  status!: CaseStatus;

  @Column('text', { name: 'withdrawn_reason', nullable: true })
  withdrawnReason!: string | null;

  @Column('text', { default: '' })
  notes!: string;

  @Column('integer', { name: 'created_by_id' })
  createdById!: number;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: TIMESTAMP_TYPE })
  updatedAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

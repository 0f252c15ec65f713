import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { FLOAT_TYPE } from './column-types';
import type { ClavienDindoGrade, StandardMetric } from '@tidemark/shared';

/** A criterion of an audit: a measure from the catalogue, a comparator, a target and its evidence. */
@Entity('audit_standard')
export class AuditStandard {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_standard_audit')
  @Column('integer', { name: 'audit_id' })
  auditId!: number;

  @Column('integer')
  position!: number;

  @Column('varchar', { length: 400 })
  criterion!: string;

  @Column('varchar', { length: 40 })
  metric!: StandardMetric;

  @Column('varchar', { name: 'interval_key', length: 20, nullable: true })
  intervalKey!: string | null;

  @Column(FLOAT_TYPE, { name: 'threshold_mm', nullable: true })
  thresholdMm!: number | null;

  @Column(FLOAT_TYPE, { name: 'threshold_pct', nullable: true })
  thresholdPct!: number | null;

  @Column('varchar', { name: 'min_grade', length: 4, nullable: true })
  minGrade!: ClavienDindoGrade | null;

  @Column('varchar', { length: 2 })
  comparator!: '>=' | '<=';

  @Column(FLOAT_TYPE)
  target!: number;

  @Column('text', { name: 'evidence_source', default: '' })
  evidenceSource!: string;

  @Column('text', { default: '' })
  exceptions!: string;

  @Column('integer', { default: 1 })
  version!: number;
}

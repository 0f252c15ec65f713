import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { ClavienDindoGrade, ComplicationType } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** A complication of a case, graded after Clavien–Dindo (2004). */
@Entity('complication')
export class Complication {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_complication_case')
  @Column('integer', { name: 'case_id' })
  caseId!: number;

  @Column('integer', { name: 'visit_id', nullable: true })
  visitId!: number | null;

  @Column('varchar', { length: 20 })
  type!: ComplicationType;

  @Column('varchar', { length: 4 })
  grade!: ClavienDindoGrade;

  @Column('varchar', { name: 'onset_date', length: 10 })
  onsetDate!: string;

  @Column('varchar', { name: 'resolution_date', length: 10, nullable: true })
  resolutionDate!: string | null;

  @Column('text', { default: '' })
  management!: string;

  @Column('integer', { name: 'created_by_id' })
  createdById!: number;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

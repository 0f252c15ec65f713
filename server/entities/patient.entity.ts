import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { DiabetesStatus, PhenotypeMethod, Sex } from '@tidemark/shared';
import type { Phenotype, SmokingStatus } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** A pseudonymised patient: a practice code and the risk factors that matter for outcomes. */
@Entity('patient')
export class Patient {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('UQ_patient_code', { unique: true })
  @Column('varchar', { length: 20 })
  code!: string;

  @Column('integer', { name: 'birth_year' })
  birthYear!: number;

  @Column('varchar', { length: 12 })
  sex!: Sex;

  @Column('varchar', { length: 8 })
  smoking!: SmokingStatus;

  @Column('integer', { name: 'cigarettes_per_day', nullable: true })
  cigarettesPerDay!: number | null;

  @Column('varchar', { length: 12 })
  diabetes!: DiabetesStatus;

  @Column('varchar', { length: 8 })
  phenotype!: Phenotype;

  @Column('varchar', { name: 'phenotype_method', length: 24 })
  phenotypeMethod!: PhenotypeMethod;

  @Column('integer', { name: 'created_by_id' })
  createdById!: number;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

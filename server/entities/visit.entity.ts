import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/** A recall visit of a case at one interval of the schedule. */
@Entity('visit')
@Index('UQ_visit_case_interval', ['caseId', 'intervalKey'], { unique: true })
export class Visit {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('integer', { name: 'case_id' })
  caseId!: number;

  @Column('varchar', { name: 'interval_key', length: 20 })
  intervalKey!: string;

  /** ISO date YYYY-MM-DD. */
  @Column('varchar', { name: 'visit_date', length: 10 })
  visitDate!: string;

  @Column('integer', { name: 'examiner_id' })
  examinerId!: number;

  @Column('integer', { nullable: true })
  pain!: number | null;

  @Column('integer', { nullable: true })
  satisfaction!: number | null;

  @Column('text', { default: '' })
  notes!: string;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

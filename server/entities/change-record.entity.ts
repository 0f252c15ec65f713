import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { TIMESTAMP_TYPE } from './column-types';

/** Append-only history of changes to clinical records (triggers refuse UPDATE and DELETE). */
@Entity('change_record')
@Index('IDX_change_record_entity', ['entity', 'entityId'])
export class ChangeRecord {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('varchar', { length: 32 })
  entity!: string;

  @Column('integer', { name: 'entity_id' })
  entityId!: number;

  /** The case the change belongs to, for per-case history and ownership checks. */
  @Index('IDX_change_record_case')
  @Column('integer', { name: 'case_id', nullable: true })
  caseId!: number | null;

  @Column('varchar', { length: 64 })
  field!: string;

  @Column('text', { name: 'old_value', nullable: true })
  oldValue!: string | null;

  @Column('text', { name: 'new_value', nullable: true })
  newValue!: string | null;

  @Column('integer', { name: 'changed_by_id' })
  changedById!: number;

  @Column({ type: TIMESTAMP_TYPE, name: 'changed_at' })
  changedAt!: Date;

  @Column('text', { nullable: true })
  reason!: string | null;
}

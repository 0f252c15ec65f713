import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { RecallInterval } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** A named recall schedule: intervals after surgery with tolerance windows. */
@Entity('recall_schedule')
export class RecallSchedule {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Column('varchar', { length: 80 })
  name!: string;

  /** Ordered intervals, stored as JSON. */
  @Column('simple-json')
  intervals!: RecallInterval[];

  /** The practice schedule: recall lists and visit entry follow it. */
  @Column('boolean', { name: 'is_default', default: false })
  isDefault!: boolean;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

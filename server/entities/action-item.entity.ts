import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { ActionState } from '@tidemark/shared';
import { TIMESTAMP_TYPE } from './column-types';

/** One line of a cycle's action plan: action, owner, deadline, state. */
@Entity('action_item')
export class ActionItem {
  @PrimaryGeneratedColumn('increment')
  id!: number;

  @Index('IDX_action_cycle')
  @Column('integer', { name: 'cycle_id' })
  cycleId!: number;

  @Column('text')
  action!: string;

  @Column('integer', { name: 'owner_id' })
  ownerId!: number;

  @Column('varchar', { name: 'due_date', length: 10 })
  dueDate!: string;

  @Column('varchar', { length: 12 })
  state!: ActionState;

  @CreateDateColumn({ name: 'created_at', type: TIMESTAMP_TYPE })
  createdAt!: Date;

  @Column('integer', { default: 1 })
  version!: number;
}

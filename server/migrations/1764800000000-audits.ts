import type { MigrationInterface, QueryRunner, TableColumnOptions } from 'typeorm';
import { Table, TableForeignKey, TableIndex } from 'typeorm';
import { DEFAULT_RECALL_SCHEDULE } from '@tidemark/shared';
import { FLOAT_TYPE, TIMESTAMP_TYPE } from '../entities/column-types';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const version: TableColumnOptions = { name: 'version', type: 'integer', default: 1 };
const createdAt: TableColumnOptions = { name: 'created_at', type: TIMESTAMP_TYPE, default: 'CURRENT_TIMESTAMP' };
const fk = (columnNames: string[], referencedTableName: string, onDelete: 'CASCADE' | 'RESTRICT' | 'SET NULL' = 'RESTRICT') =>
  new TableForeignKey({ columnNames, referencedTableName, referencedColumnNames: ['id'], onDelete });

/** Recall schedules (with the default one), audits, standards, cycles, action plans, review notes, calibration readings. */
export class Audits1764800000000 implements MigrationInterface {
  name = 'Audits1764800000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'recall_schedule',
        columns: [id, { name: 'name', type: 'varchar', length: '80' }, { name: 'intervals', type: 'text' }, { name: 'is_default', type: 'boolean', default: false }, createdAt, version],
      }),
    );
    const placeholders = queryRunner.connection.options.type === 'postgres' ? '$1, $2, $3' : '?, ?, ?';
    await queryRunner.query(`INSERT INTO recall_schedule (name, intervals, is_default, version) VALUES (${placeholders}, 1)`, [
      'Practice schedule (2 weeks to 12 months)',
      JSON.stringify(DEFAULT_RECALL_SCHEDULE),
      true,
    ]);
    await queryRunner.createTable(
      new Table({
        name: 'audit',
        columns: [
          id,
          { name: 'title', type: 'varchar', length: '160' },
          { name: 'rationale', type: 'text', default: "''" },
          { name: 'lead_id', type: 'integer' },
          { name: 'schedule_id', type: 'integer' },
          { name: 'stable_threshold', type: FLOAT_TYPE },
          { name: 'relapse_threshold', type: FLOAT_TYPE },
          { name: 'cohort', type: 'text' },
          { name: 'reaudit_date', type: 'varchar', length: '10', isNullable: true },
          createdAt,
          version,
        ],
        foreignKeys: [fk(['lead_id'], 'user'), fk(['schedule_id'], 'recall_schedule')],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'audit_standard',
        columns: [
          id,
          { name: 'audit_id', type: 'integer' },
          { name: 'position', type: 'integer' },
          { name: 'criterion', type: 'varchar', length: '400' },
          { name: 'metric', type: 'varchar', length: '40' },
          { name: 'interval_key', type: 'varchar', length: '20', isNullable: true },
          { name: 'threshold_mm', type: FLOAT_TYPE, isNullable: true },
          { name: 'threshold_pct', type: FLOAT_TYPE, isNullable: true },
          { name: 'min_grade', type: 'varchar', length: '4', isNullable: true },
          { name: 'comparator', type: 'varchar', length: '2' },
          { name: 'target', type: FLOAT_TYPE },
          { name: 'evidence_source', type: 'text', default: "''" },
          { name: 'exceptions', type: 'text', default: "''" },
          version,
        ],
        foreignKeys: [fk(['audit_id'], 'audit', 'CASCADE')],
        indices: [new TableIndex({ name: 'IDX_standard_audit', columnNames: ['audit_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'audit_cycle',
        columns: [
          id,
          { name: 'audit_id', type: 'integer' },
          { name: 'number', type: 'integer' },
          { name: 'period_start', type: 'varchar', length: '10' },
          { name: 'period_end', type: 'varchar', length: '10' },
          { name: 'state', type: 'varchar', length: '12' },
          { name: 'frozen_at', type: TIMESTAMP_TYPE, isNullable: true },
          { name: 'snapshot', type: 'text', isNullable: true },
          { name: 'presented_date', type: 'varchar', length: '10', isNullable: true },
          { name: 'notes', type: 'text', default: "''" },
          version,
        ],
        foreignKeys: [fk(['audit_id'], 'audit', 'CASCADE')],
        indices: [new TableIndex({ name: 'UQ_cycle_audit_number', columnNames: ['audit_id', 'number'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'action_item',
        columns: [
          id,
          { name: 'cycle_id', type: 'integer' },
          { name: 'action', type: 'text' },
          { name: 'owner_id', type: 'integer' },
          { name: 'due_date', type: 'varchar', length: '10' },
          { name: 'state', type: 'varchar', length: '12' },
          createdAt,
          version,
        ],
        foreignKeys: [fk(['cycle_id'], 'audit_cycle', 'CASCADE'), fk(['owner_id'], 'user')],
        indices: [new TableIndex({ name: 'IDX_action_cycle', columnNames: ['cycle_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'review_note',
        columns: [
          id,
          { name: 'audit_id', type: 'integer' },
          { name: 'cycle_id', type: 'integer', isNullable: true },
          { name: 'topic', type: 'varchar', length: '60' },
          { name: 'text', type: 'text' },
          { name: 'author_id', type: 'integer' },
          createdAt,
        ],
        foreignKeys: [fk(['audit_id'], 'audit', 'CASCADE'), fk(['cycle_id'], 'audit_cycle', 'CASCADE'), fk(['author_id'], 'user')],
        indices: [new TableIndex({ name: 'IDX_note_audit', columnNames: ['audit_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'calibration_reading',
        columns: [
          id,
          { name: 'site_id', type: 'integer' },
          { name: 'examiner_id', type: 'integer' },
          { name: 'measured_on', type: 'varchar', length: '10' },
          { name: 'ref_gm', type: FLOAT_TYPE },
          createdAt,
        ],
        checks: [{ name: 'CHK_calibration_ref_gm', expression: 'ref_gm >= 0 AND ref_gm <= 20' }],
        foreignKeys: [fk(['site_id'], 'site', 'CASCADE'), fk(['examiner_id'], 'user')],
        indices: [new TableIndex({ name: 'IDX_calibration_site_day', columnNames: ['site_id', 'measured_on'] })],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['calibration_reading', 'review_note', 'action_item', 'audit_cycle', 'audit_standard', 'audit', 'recall_schedule']) {
      await queryRunner.dropTable(table);
    }
  }
}

import type { MigrationInterface, QueryRunner, TableColumnOptions } from 'typeorm';
import { Table, TableForeignKey, TableIndex } from 'typeorm';
import { FLOAT_TYPE, TIMESTAMP_TYPE } from '../entities/column-types';

const id: TableColumnOptions = { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' };
const version: TableColumnOptions = { name: 'version', type: 'integer', default: 1 };
const createdAt: TableColumnOptions = { name: 'created_at', type: TIMESTAMP_TYPE, default: 'CURRENT_TIMESTAMP' };
const mm = (name: string, isNullable = true): TableColumnOptions => ({ name, type: FLOAT_TYPE, isNullable });
const mmCheck = (column: string) => ({ name: `CHK_${column}_mm`, expression: `${column} IS NULL OR (${column} >= 0 AND ${column} <= 20)` });
const fk = (columnNames: string[], referencedTableName: string, onDelete: 'CASCADE' | 'RESTRICT' | 'SET NULL' = 'RESTRICT') =>
  new TableForeignKey({ columnNames, referencedTableName, referencedColumnNames: ['id'], onDelete });

/** Patients, cases, sites, visits, measurements, complications, photos and the append-only change history. */
export class ClinicalRecords1764700000000 implements MigrationInterface {
  name = 'ClinicalRecords1764700000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'patient',
        columns: [
          id,
          { name: 'code', type: 'varchar', length: '20' },
          { name: 'birth_year', type: 'integer' },
          { name: 'sex', type: 'varchar', length: '12' },
          { name: 'smoking', type: 'varchar', length: '8' },
          { name: 'cigarettes_per_day', type: 'integer', isNullable: true },
          { name: 'diabetes', type: 'varchar', length: '12' },
          { name: 'phenotype', type: 'varchar', length: '8' },
          { name: 'phenotype_method', type: 'varchar', length: '24' },
          { name: 'created_by_id', type: 'integer' },
          createdAt,
          version,
        ],
        foreignKeys: [fk(['created_by_id'], 'user')],
        indices: [new TableIndex({ name: 'UQ_patient_code', columnNames: ['code'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'surgical_case',
        columns: [
          id,
          { name: 'patient_id', type: 'integer' },
          { name: 'operator_id', type: 'integer' },
          { name: 'surgery_date', type: 'varchar', length: '10' },
          { name: 'procedure', type: 'varchar', length: '32' },
          { name: 'indication', type: 'varchar', length: '32' },
          { name: 'instrument', type: 'varchar', length: '16' },
          { name: 'hygiene_phase_complete', type: 'boolean', default: false },
          { name: 'bleeding_score_pct', type: FLOAT_TYPE, isNullable: true },
          { name: 'plaque_score_pct', type: FLOAT_TYPE, isNullable: true },
          mm('deepest_probing_mm'),
          { name: 'suture_resorbable', type: 'boolean', isNullable: true },
          { name: 'suture_size', type: 'varchar', length: '8', isNullable: true },
          { name: 'provisional_restorations', type: 'boolean', default: false },
          { name: 'intra_operative_events', type: 'text', default: "''" },
          { name: 'final_impression_date', type: 'varchar', length: '10', isNullable: true },
          { name: 'final_restoration_date', type: 'varchar', length: '10', isNullable: true },
          { name: 'status', type: 'varchar', length: '16' },
          { name: 'withdrawn_reason', type: 'text', isNullable: true },
          { name: 'notes', type: 'text', default: "''" },
          { name: 'created_by_id', type: 'integer' },
          createdAt,
          { name: 'updated_at', type: TIMESTAMP_TYPE, default: 'CURRENT_TIMESTAMP' },
          version,
        ],
        foreignKeys: [fk(['patient_id'], 'patient'), fk(['operator_id'], 'user'), fk(['created_by_id'], 'user')],
        indices: [
          new TableIndex({ name: 'IDX_case_patient', columnNames: ['patient_id'] }),
          new TableIndex({ name: 'IDX_case_operator', columnNames: ['operator_id'] }),
          new TableIndex({ name: 'IDX_case_surgery_date', columnNames: ['surgery_date'] }),
          new TableIndex({ name: 'IDX_case_status', columnNames: ['status'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'site',
        columns: [
          id,
          { name: 'case_id', type: 'integer' },
          { name: 'tooth', type: 'integer' },
          { name: 'location', type: 'varchar', length: '16' },
          { name: 'reference_point', type: 'varchar', length: '20' },
          mm('baseline_ref_gm', false),
          mm('probing_depth'),
          mm('kt_width'),
          mm('margin_to_crest'),
          { name: 'papilla_score', type: 'integer', isNullable: true },
          mm('planned_excision'),
          mm('post_op_ref_gm'),
          version,
        ],
        checks: [mmCheck('baseline_ref_gm'), mmCheck('post_op_ref_gm'), { name: 'CHK_site_papilla', expression: 'papilla_score IS NULL OR (papilla_score >= 0 AND papilla_score <= 4)' }],
        foreignKeys: [fk(['case_id'], 'surgical_case', 'CASCADE')],
        indices: [new TableIndex({ name: 'UQ_site_case_tooth_location', columnNames: ['case_id', 'tooth', 'location'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'visit',
        columns: [
          id,
          { name: 'case_id', type: 'integer' },
          { name: 'interval_key', type: 'varchar', length: '20' },
          { name: 'visit_date', type: 'varchar', length: '10' },
          { name: 'examiner_id', type: 'integer' },
          { name: 'pain', type: 'integer', isNullable: true },
          { name: 'satisfaction', type: 'integer', isNullable: true },
          { name: 'notes', type: 'text', default: "''" },
          createdAt,
          version,
        ],
        foreignKeys: [fk(['case_id'], 'surgical_case', 'CASCADE'), fk(['examiner_id'], 'user')],
        indices: [new TableIndex({ name: 'UQ_visit_case_interval', columnNames: ['case_id', 'interval_key'], isUnique: true })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'site_measurement',
        columns: [
          id,
          { name: 'visit_id', type: 'integer' },
          { name: 'site_id', type: 'integer' },
          mm('ref_gm', false),
          mm('probing_depth'),
          { name: 'bleeding_on_probing', type: 'boolean', isNullable: true },
          mm('kt_width'),
          { name: 'papilla_score', type: 'integer', isNullable: true },
        ],
        checks: [mmCheck('ref_gm')],
        foreignKeys: [fk(['visit_id'], 'visit', 'CASCADE'), fk(['site_id'], 'site', 'CASCADE')],
        indices: [
          new TableIndex({ name: 'UQ_measurement_visit_site', columnNames: ['visit_id', 'site_id'], isUnique: true }),
          new TableIndex({ name: 'IDX_measurement_site', columnNames: ['site_id'] }),
        ],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'complication',
        columns: [
          id,
          { name: 'case_id', type: 'integer' },
          { name: 'visit_id', type: 'integer', isNullable: true },
          { name: 'type', type: 'varchar', length: '20' },
          { name: 'grade', type: 'varchar', length: '4' },
          { name: 'onset_date', type: 'varchar', length: '10' },
          { name: 'resolution_date', type: 'varchar', length: '10', isNullable: true },
          { name: 'management', type: 'text', default: "''" },
          { name: 'created_by_id', type: 'integer' },
          createdAt,
          version,
        ],
        foreignKeys: [fk(['case_id'], 'surgical_case', 'CASCADE'), fk(['visit_id'], 'visit', 'SET NULL'), fk(['created_by_id'], 'user')],
        indices: [new TableIndex({ name: 'IDX_complication_case', columnNames: ['case_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'photo',
        columns: [
          id,
          { name: 'case_id', type: 'integer' },
          { name: 'visit_id', type: 'integer', isNullable: true },
          { name: 'kind', type: 'varchar', length: '16' },
          { name: 'storage_key', type: 'varchar', length: '200' },
          { name: 'thumbnail_key', type: 'varchar', length: '200' },
          { name: 'content_type', type: 'varchar', length: '32' },
          { name: 'bytes', type: 'integer' },
          { name: 'sha256', type: 'varchar', length: '64' },
          { name: 'width', type: 'integer' },
          { name: 'height', type: 'integer' },
          { name: 'uploaded_by_id', type: 'integer' },
          { name: 'month_taken', type: 'varchar', length: '7' },
          createdAt,
        ],
        foreignKeys: [fk(['case_id'], 'surgical_case', 'CASCADE'), fk(['visit_id'], 'visit', 'SET NULL'), fk(['uploaded_by_id'], 'user')],
        indices: [new TableIndex({ name: 'IDX_photo_case', columnNames: ['case_id'] })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'change_record',
        columns: [
          id,
          { name: 'entity', type: 'varchar', length: '32' },
          { name: 'entity_id', type: 'integer' },
          { name: 'case_id', type: 'integer', isNullable: true },
          { name: 'field', type: 'varchar', length: '64' },
          { name: 'old_value', type: 'text', isNullable: true },
          { name: 'new_value', type: 'text', isNullable: true },
          { name: 'changed_by_id', type: 'integer' },
          { name: 'changed_at', type: TIMESTAMP_TYPE },
          { name: 'reason', type: 'text', isNullable: true },
        ],
        foreignKeys: [fk(['changed_by_id'], 'user')],
        indices: [
          new TableIndex({ name: 'IDX_change_record_entity', columnNames: ['entity', 'entity_id'] }),
          new TableIndex({ name: 'IDX_change_record_case', columnNames: ['case_id'] }),
        ],
      }),
    );
    // The history is append-only: the database itself refuses edits and deletions.
    if (queryRunner.connection.options.type === 'postgres') {
      await queryRunner.query(
        `CREATE FUNCTION change_record_append_only() RETURNS trigger AS $$ BEGIN RAISE EXCEPTION 'change_record is append-only'; END; $$ LANGUAGE plpgsql`,
      );
      await queryRunner.query(
        `CREATE TRIGGER change_record_append_only BEFORE UPDATE OR DELETE ON change_record FOR EACH ROW EXECUTE FUNCTION change_record_append_only()`,
      );
    } else {
      await queryRunner.query(
        `CREATE TRIGGER change_record_no_update BEFORE UPDATE ON change_record BEGIN SELECT RAISE(ABORT, 'change_record is append-only'); END`,
      );
      await queryRunner.query(
        `CREATE TRIGGER change_record_no_delete BEFORE DELETE ON change_record BEGIN SELECT RAISE(ABORT, 'change_record is append-only'); END`,
      );
    }
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    if (queryRunner.connection.options.type === 'postgres') {
      await queryRunner.query('DROP TRIGGER IF EXISTS change_record_append_only ON change_record');
      await queryRunner.query('DROP FUNCTION IF EXISTS change_record_append_only()');
    } else {
      await queryRunner.query('DROP TRIGGER IF EXISTS change_record_no_update');
      await queryRunner.query('DROP TRIGGER IF EXISTS change_record_no_delete');
    }
    for (const table of ['change_record', 'photo', 'complication', 'site_measurement', 'visit', 'site', 'surgical_case', 'patient']) {
      await queryRunner.dropTable(table);
    }
  }
}

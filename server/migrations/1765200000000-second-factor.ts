import type { MigrationInterface, QueryRunner } from 'typeorm';
import { Table, TableForeignKey, TableIndex } from 'typeorm';
import { TIMESTAMP_TYPE } from '../entities/column-types';

/**
 * One-time codes (TOTP) and recovery codes. New tables only (no change to `user`), built
 * with TypeORM's schema builder so the same migration runs on SQLite and PostgreSQL.
 */
export class SecondFactor1765200000000 implements MigrationInterface {
  name = 'SecondFactor1765200000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'user_second_factor',
        columns: [
          { name: 'user_id', type: 'integer', isPrimary: true },
          { name: 'secret_sealed', type: 'varchar', length: '200', isNullable: true },
          { name: 'enabled_at', type: TIMESTAMP_TYPE, isNullable: true },
          { name: 'last_used_step', type: 'integer', isNullable: true },
          { name: 'pending_secret_sealed', type: 'varchar', length: '200', isNullable: true },
          { name: 'pending_since', type: TIMESTAMP_TYPE, isNullable: true },
        ],
        foreignKeys: [new TableForeignKey({ columnNames: ['user_id'], referencedTableName: 'user', referencedColumnNames: ['id'], onDelete: 'CASCADE' })],
      }),
    );
    await queryRunner.createTable(
      new Table({
        name: 'recovery_code',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'user_id', type: 'integer' },
          { name: 'code_hash', type: 'varchar', length: '64' },
          { name: 'used_at', type: TIMESTAMP_TYPE, isNullable: true },
          { name: 'created_at', type: TIMESTAMP_TYPE },
        ],
        indices: [new TableIndex({ name: 'IDX_recovery_code_user', columnNames: ['user_id'] })],
        foreignKeys: [new TableForeignKey({ columnNames: ['user_id'], referencedTableName: 'user', referencedColumnNames: ['id'], onDelete: 'CASCADE' })],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('recovery_code');
    await queryRunner.dropTable('user_second_factor');
  }
}

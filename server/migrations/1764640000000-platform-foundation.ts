import type { MigrationInterface, QueryRunner } from 'typeorm';
import { Table, TableIndex } from 'typeorm';
import { TIMESTAMP_TYPE } from '../entities/column-types';

/** Users and sessions. Written with TypeORM's schema builder so it runs on SQLite and PostgreSQL. */
export class PlatformFoundation1764640000000 implements MigrationInterface {
  name = 'PlatformFoundation1764640000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'user',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'email', type: 'varchar', length: '254' },
          { name: 'display_name', type: 'varchar', length: '120' },
          { name: 'role', type: 'varchar', length: '20' },
          { name: 'active', type: 'boolean', default: true },
          { name: 'password_hash', type: 'varchar', length: '255' },
          { name: 'created_at', type: TIMESTAMP_TYPE, default: 'CURRENT_TIMESTAMP' },
          { name: 'last_sign_in_at', type: TIMESTAMP_TYPE, isNullable: true },
        ],
        checks: [{ name: 'CHK_user_role', expression: `role IN ('admin','audit_lead','clinician','partner','governance')` }],
      }),
    );
    await queryRunner.createIndex('user', new TableIndex({ name: 'UQ_user_email', columnNames: ['email'], isUnique: true }));

    await queryRunner.createTable(
      new Table({
        name: 'session',
        columns: [
          { name: 'sid', type: 'varchar', length: '128', isPrimary: true },
          { name: 'data', type: 'text' },
          { name: 'expires_at', type: 'bigint' },
          { name: 'user_id', type: 'integer', isNullable: true },
        ],
      }),
    );
    await queryRunner.createIndex('session', new TableIndex({ name: 'IDX_session_expires_at', columnNames: ['expires_at'] }));
    await queryRunner.createIndex('session', new TableIndex({ name: 'IDX_session_user_id', columnNames: ['user_id'] }));
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('session');
    await queryRunner.dropTable('user');
  }
}

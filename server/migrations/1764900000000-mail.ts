import type { MigrationInterface, QueryRunner } from 'typeorm';
import { Table, TableIndex } from 'typeorm';
import { TIMESTAMP_TYPE } from '../entities/column-types';

/** The outgoing mail queue with retries. */
export class Mail1764900000000 implements MigrationInterface {
  name = 'Mail1764900000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.createTable(
      new Table({
        name: 'mail_message',
        columns: [
          { name: 'id', type: 'integer', isPrimary: true, isGenerated: true, generationStrategy: 'increment' },
          { name: 'kind', type: 'varchar', length: '24' },
          { name: 'to_address', type: 'varchar', length: '254' },
          { name: 'subject', type: 'varchar', length: '200' },
          { name: 'body', type: 'text' },
          { name: 'status', type: 'varchar', length: '8' },
          { name: 'attempts', type: 'integer', default: 0 },
          { name: 'last_error', type: 'text', isNullable: true },
          { name: 'next_attempt_at', type: TIMESTAMP_TYPE, isNullable: true },
          { name: 'sent_at', type: TIMESTAMP_TYPE, isNullable: true },
          { name: 'message_id', type: 'varchar', length: '200', isNullable: true },
          { name: 'dedupe_key', type: 'varchar', length: '80', isNullable: true },
          { name: 'created_at', type: TIMESTAMP_TYPE, default: 'CURRENT_TIMESTAMP' },
        ],
        indices: [
          new TableIndex({ name: 'IDX_mail_status_next', columnNames: ['status', 'next_attempt_at'] }),
          new TableIndex({ name: 'UQ_mail_dedupe', columnNames: ['dedupe_key'], isUnique: true }),
        ],
      }),
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropTable('mail_message');
  }
}

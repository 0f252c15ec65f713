import type { DataSource } from 'typeorm';
import type { ChangeRecordView } from '@tidemark/shared';
import { ChangeRecord } from '../entities/change-record.entity';
import { HttpError } from '../http-error';
import { mapChangeRecord } from './clinical-mappers';
import type { OperatorDirectory } from './operator-directory';

/** Roles that may read the change history (DESIGN.md §2); clinicians only their own cases. */
const HISTORY_READERS = new Set(['admin', 'audit_lead', 'partner', 'clinician']);

/** The append-only change history, newest first. */
export class HistoryService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly operators: OperatorDirectory,
  ) {}

  async list(user: Express.User, query: { caseId?: number; page: number; pageSize: number }): Promise<{ items: ChangeRecordView[]; total: number }> {
    if (!HISTORY_READERS.has(user.role)) throw HttpError.forbidden('Your role does not see the change history.');
    const builder = this.dataSource.getRepository(ChangeRecord).createQueryBuilder('r');
    if (user.role === 'clinician') {
      // Own cases, and edits to the patients of own cases (patient rows carry no case id).
      builder.andWhere(
        "(r.case_id IN (SELECT c.id FROM surgical_case c WHERE c.operator_id = :self) OR (r.entity = 'patient' AND r.entity_id IN (SELECT c.patient_id FROM surgical_case c WHERE c.operator_id = :self)))",
        { self: user.id },
      );
    }
    if (query.caseId) builder.andWhere('r.case_id = :caseId', { caseId: query.caseId });
    const [records, total] = await builder
      .orderBy('r.changed_at', 'DESC')
      .addOrderBy('r.id', 'DESC')
      .skip(query.page * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    const operator = await this.operators.lookup(records.map((record) => record.changedById));
    return { items: records.map((record) => mapChangeRecord(record, operator)), total };
  }
}

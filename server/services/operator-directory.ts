import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { OperatorView } from '@tidemark/shared';
import { User } from '../entities/user.entity';
import type { OperatorLookup } from './clinical-mappers';

/** Roles that operate and examine. */
export const OPERATOR_ROLES = ['clinician', 'audit_lead'] as const;

/** Names of users for display, loaded in one query per request. */
export class OperatorDirectory {
  constructor(private readonly dataSource: DataSource) {}

  /** Everyone who may operate (active clinicians and audit leads), for pickers and filters. */
  async listOperators(): Promise<OperatorView[]> {
    const users = await this.dataSource.getRepository(User).find({
      where: { role: In([...OPERATOR_ROLES]), active: true },
      order: { displayName: 'ASC' },
    });
    return users.map((user) => ({ id: user.id, displayName: user.displayName }));
  }

  /** True when the id belongs to an active operator. */
  async isOperator(id: number): Promise<boolean> {
    return this.dataSource.getRepository(User).existsBy({ id, role: In([...OPERATOR_ROLES]), active: true });
  }

  /** A lookup function for the given ids. */
  async lookup(ids: Iterable<number>): Promise<OperatorLookup> {
    const unique = [...new Set(ids)];
    const users = unique.length ? await this.dataSource.getRepository(User).findBy({ id: In(unique) }) : [];
    const names = new Map(users.map((user) => [user.id, user.displayName]));
    return (id) => ({ id, displayName: names.get(id) ?? `User ${id}` });
  }
}

import type { EntityManager, EntityTarget, ObjectLiteral, QueryDeepPartialEntity } from 'typeorm';
import { HttpError } from '../http-error';

/**
 * Optimistic locking done in the statement itself: `UPDATE … SET …, version = version + 1
 * WHERE id = ? AND version = ?`. TypeORM's @VersionColumn alone lets a stale save win.
 * Answers 409 with the current version when someone else changed the row first.
 */
export async function updateWithVersion<T extends ObjectLiteral>(
  manager: EntityManager,
  target: EntityTarget<T>,
  id: number,
  expectedVersion: number,
  changes: Record<string, unknown>,
  options: { isTouched?: boolean } = {},
): Promise<void> {
  // `isTouched`: a child row changed (e.g. a visit's measurements), so the parent's version moves too.
  if (Object.keys(changes).length === 0 && !options.isTouched) {
    // Nothing changes: keep the version (a no-op must not make others' next save fail), but still refuse a stale one.
    await assertCurrentVersion(manager, target, id, expectedVersion);
    return;
  }
  const result = await manager
    .createQueryBuilder()
    .update(target)
    // The QueryBuilder's typed `set` cannot know these dynamic column names.
    .set({ ...changes, version: () => 'version + 1' } as QueryDeepPartialEntity<T>)
    .where('id = :id AND version = :version', { id, version: expectedVersion })
    .execute();
  if (result.affected === 1) return;
  await assertCurrentVersion(manager, target, id, expectedVersion);
  throw HttpError.conflict('The record changed while saving. Reload and try again.');
}

async function assertCurrentVersion<T extends ObjectLiteral>(manager: EntityManager, target: EntityTarget<T>, id: number, expectedVersion: number): Promise<void> {
  const current = await manager.createQueryBuilder().select('t.version', 'version').from(target, 't').where('t.id = :id', { id }).getRawOne<{ version: number }>();
  if (!current) throw HttpError.notFound('The record');
  if (Number(current.version) === expectedVersion) return;
  throw new HttpError(409, 'conflict', 'Someone else changed this record since you opened it. Reload to see the current values.', undefined, {
    currentVersion: Number(current.version),
  });
}

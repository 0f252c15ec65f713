import type { DataSource, EntityTarget } from 'typeorm';

/**
 * A function turning a raw value of one entity column, as a parameterised query returns it, into
 * what the entity's property would hold: TypeORM's own conversion for the data source's driver
 * (`driver.prepareHydratedValue`), e.g. SQLite's 0/1 into a boolean and its `datetime` text,
 * read as UTC, into a `Date`. Statements that skip the repository for speed use it so that their
 * values compare equal to those read through the entity.
 *
 * @throws {Error} when the entity maps no such property (at start, not per request)
 */
export function columnHydrator<Entity>(dataSource: DataSource, entity: EntityTarget<Entity>, property: keyof Entity & string): (raw: unknown) => unknown {
  const column = dataSource.getMetadata(entity).findColumnWithPropertyName(property);
  if (!column) throw new Error(`The entity metadata has no column for the property "${property}".`);
  return (raw) => dataSource.driver.prepareHydratedValue(raw, column);
}

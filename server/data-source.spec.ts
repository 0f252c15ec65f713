import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { IS_POSTGRES_SCHEMA } from './entities/column-types';
import { openDatabase } from './data-source';

// The queue is for SQLite's single connection; PostgreSQL runs (npm run test:pg) use a pool and its own locking.
describe.runIf(!IS_POSTGRES_SCHEMA)('transactions on the SQLite data source', () => {
  let dir: string;
  let dataSource: DataSource;
  beforeEach(async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'tidemark-tx-'));
    dataSource = await openDatabase({ database: path.join(dir, 'tidemark.sqlite') });
    await dataSource.query('CREATE TABLE probe (id INTEGER PRIMARY KEY, tag TEXT NOT NULL)');
  });
  afterEach(async () => {
    await dataSource.destroy();
    rmSync(dir, { recursive: true, force: true });
  });

  const tags = async (): Promise<string[]> => ((await dataSource.query('SELECT tag FROM probe ORDER BY id')) as { tag: string }[]).map((row) => row.tag);

  it('run one after another when begun at once, so a failing one takes back only its own rows', async () => {
    const work = (tag: string, fails: boolean) =>
      dataSource.transaction(async (manager) => {
        await manager.query('INSERT INTO probe (tag) VALUES (?)', [`${tag}1`]);
        // A real wait (a timer, like file or network I/O) lets the others try to begin meanwhile.
        await new Promise((resolve) => setTimeout(resolve, 5));
        await manager.query('INSERT INTO probe (tag) VALUES (?)', [`${tag}2`]);
        if (fails) throw new Error(`${tag} fails`);
        return tag;
      });
    const outcomes = await Promise.allSettled([work('a', false), work('b', true), work('c', false)]);
    expect(outcomes.map((outcome) => outcome.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect(await tags()).toEqual(['a1', 'a2', 'c1', 'c2']);
  });

  it('let a transaction begun inside another join it instead of waiting for itself', async () => {
    await dataSource.transaction(async (manager) => {
      await manager.query('INSERT INTO probe (tag) VALUES (?)', ['outer']);
      await dataSource.transaction(async (inner) => {
        await inner.query('INSERT INTO probe (tag) VALUES (?)', ['inner']);
      });
    });
    expect(await tags()).toEqual(['outer', 'inner']);
  });
});

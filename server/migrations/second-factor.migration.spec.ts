import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { openDatabase } from '../data-source';

describe('migration SecondFactor1765200000000', () => {
  let dataDir: string;
  let dataSource: DataSource;

  beforeAll(async () => {
    dataDir = mkdtempSync(path.join(tmpdir(), 'tidemark-migration-'));
    dataSource = await openDatabase({ database: path.join(dataDir, 'tidemark.sqlite') });
  });
  afterAll(async () => {
    await dataSource.destroy();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('creates both tables, drops them on the way down and creates them again', async () => {
    const tables = async (): Promise<string[]> => {
      const runner = dataSource.createQueryRunner();
      try {
        return (await runner.getTables(['user_second_factor', 'recovery_code'])).map((table) => table.name).sort();
      } finally {
        await runner.release();
      }
    };
    expect(await tables()).toEqual(['recovery_code', 'user_second_factor']);
    const migration = dataSource.migrations.find((candidate) => candidate.name === 'SecondFactor1765200000000');
    expect(migration).toBeDefined();
    const runner = dataSource.createQueryRunner();
    try {
      await migration?.down(runner);
      expect(await tables()).toEqual([]);
      await migration?.up(runner);
    } finally {
      await runner.release();
    }
    expect(await tables()).toEqual(['recovery_code', 'user_second_factor']);
  });
});

import { existsSync, readdirSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import type { CaseDetail } from '@tidemark/shared';
import { caseBody, siteBody, visitBody } from '../api/support/clinical-fixtures';
import { demoEmail } from '../api/support/test-app';
import type { RunningServer } from '../e2e/support/server';
import { preparedDataDir, startServerOn } from './support/served-data-dir';
import { backupDatabase } from '../../server/maintenance/database-backup';
import { soundness, withDatabase } from './support/database-checks';
import { ServerSession } from './support/server-session';
import { runTsxScript } from './support/tsx-script';

/*
 * Backup and restore against the real server (`tsx server/main.ts` in a child process, as users
 * run it) on a temporary data dir, with the CLIs run as `npm run backup` / `npm run restore` run them.
 * The refusals of a bad backup file are in restore-refusals.spec.ts.
 */

const BACKUP_NAME = /^tidemark-\d{8}T\d{6}Z(-\d+)?\.sqlite$/;
const SITES_PER_CASE = 2;

describe('backup and restore with the server running', () => {
  let dataDir: string;
  let database: string;
  let backupsDir: string;
  let server: RunningServer | null = null;
  /** The CLIs' environment: the same data dir as the server. */
  let env: Record<string, string>;

  const start = (): Promise<RunningServer> => startServerOn(dataDir);

  beforeAll(async () => {
    ({ dataDir, database, env } = await preparedDataDir());
    backupsDir = path.join(dataDir, 'backups');
    server = await start();
  }, 120_000);

  afterAll(async () => {
    await server?.stop();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('npm run backup while the server keeps taking writes gives a verified, consistent snapshot', { timeout: 90_000 }, async () => {
    const running = server as RunningServer;
    const clinician = new ServerSession(running.baseUrl);
    const clinicianId = await clinician.signIn(demoEmail('clinician'));
    const acknowledged: Array<{ id: number; at: number }> = [];
    const failures: string[] = [];
    let isWriting = true;
    const writer = (async () => {
      while (isWriting) {
        const answer = await clinician.post<CaseDetail>('/api/cases', caseBody(clinicianId, { sites: [siteBody({ tooth: 11 }), siteBody({ tooth: 21 })] }));
        if (answer.status === 201) acknowledged.push({ id: answer.body.id, at: performance.now() });
        else failures.push(`${answer.status} ${JSON.stringify(answer.body)}`);
      }
    })();
    try {
      while (acknowledged.length < 5 && failures.length === 0) await new Promise((resolve) => setTimeout(resolve, 20));
      for (let attempt = 1; attempt <= 2; attempt += 1) {
        const before = new Set(acknowledged.map(({ id }) => id));
        const startedAt = performance.now();
        const run = await runTsxScript('server/cli/backup.ts', [], env);
        const endedAt = performance.now();
        const after = new Set(acknowledged.map(({ id }) => id));
        expect(run.code, run.stderr).toBe(0);

        const file = /^Backup written: (.+)$/m.exec(run.stdout)?.[1] ?? '';
        expect(path.dirname(file)).toBe(backupsDir);
        expect(path.basename(file)).toMatch(BACKUP_NAME);
        expect(Number(/^Size: (\d+) bytes/m.exec(run.stdout)?.[1])).toBe(statSync(file).size);
        // One self-contained file: a rollback journal, no -wal/-shm beside it.
        expect(readdirSync(backupsDir).filter((name) => name.startsWith(path.basename(file)))).toEqual([path.basename(file)]);

        const copy = withDatabase(file, (db) => ({
          checks: soundness(db),
          journalMode: db.pragma('journal_mode', { simple: true }),
          caseIds: db.prepare<[], { id: number }>('SELECT id FROM surgical_case').all().map(({ id }) => id),
          casesMissingSites: db.prepare(`SELECT id FROM surgical_case c WHERE (SELECT COUNT(*) FROM site s WHERE s.case_id = c.id) <> ${SITES_PER_CASE}`).all(),
        }));
        expect(copy.checks).toEqual({ integrity: 'ok', foreignKeyViolations: [] });
        expect(copy.journalMode).toBe('delete');
        expect(copy.casesMissingSites).toEqual([]);
        // A snapshot: every case acknowledged before the backup began is in it, and nothing that
        // was not acknowledged by its end except the one request then in flight (one writer).
        expect([...before].filter((id) => !copy.caseIds.includes(id))).toEqual([]);
        expect(copy.caseIds.filter((id) => !after.has(id)).length).toBeLessThanOrEqual(1);
        // The server kept writing while the backup ran (WAL: the backup's read blocks no writer).
        expect(acknowledged.filter(({ at }) => at > startedAt && at < endedAt).length).toBeGreaterThan(0);
      }
    } finally {
      isWriting = false;
      await writer;
    }
    expect(failures).toEqual([]);
    expect(withDatabase(database, soundness)).toEqual({ integrity: 'ok', foreignKeyViolations: [] });
  });

  it('npm run restore refuses while the server is running, and changes nothing', { timeout: 60_000 }, async () => {
    const running = server as RunningServer;
    const backup = await backupDatabase({ databaseFile: database, backupsDir });
    const session = new ServerSession(running.baseUrl);
    const clinicianId = await session.signIn(demoEmail('clinician'));
    const created = await session.post<CaseDetail>('/api/cases', caseBody(clinicianId));
    expect(created.status).toBe(201);
    const casesBefore = withDatabase(database, (db) => db.prepare('SELECT COUNT(*) AS n FROM surgical_case').get());

    const run = await runTsxScript('server/cli/restore.ts', [backup.file], env);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/Restore refused: The database .* is in use: stop the Tidemark server/);
    expect(run.stderr).toMatch(/Nothing was changed\./);
    expect(readdirSync(backupsDir).filter((name) => name.startsWith('before-restore-'))).toEqual([]);
    expect(withDatabase(database, (db) => db.prepare('SELECT COUNT(*) AS n FROM surgical_case').get())).toEqual(casesBefore);
    // The server still serves, the case made after the backup included.
    expect((await session.get(`/api/cases/${created.body.id}`)).status).toBe(200);
  });

  it('npm run restore returns to the backup point, keeps a safety copy, and signs everyone out', { timeout: 120_000 }, async () => {
    const running = server as RunningServer;
    const clinician = new ServerSession(running.baseUrl);
    const clinicianId = await clinician.signIn(demoEmail('clinician'));
    const kept = await clinician.post<CaseDetail>('/api/cases', caseBody(clinicianId));
    expect(kept.status).toBe(201);

    const backup = await backupDatabase({ databaseFile: database, backupsDir });

    const dropped = await clinician.post<CaseDetail>('/api/cases', caseBody(clinicianId));
    expect(dropped.status).toBe(201);
    const recall = await clinician.post<CaseDetail>(`/api/cases/${kept.body.id}/visits`, visitBody(kept.body.sites.map((site) => ({ siteId: site.id, refGm: 9.5 }))));
    expect(recall.status).toBe(201);
    expect(recall.body.visits).toHaveLength(1);

    await running.stop();
    server = null;
    const run = await runTsxScript('server/cli/restore.ts', [backup.file], env);
    expect(run.code, run.stderr).toBe(0);
    const safetyCopy = /kept in (\S+)\.$/m.exec(run.stdout)?.[1] ?? '';
    expect(path.basename(safetyCopy)).toMatch(/^before-restore-\d{8}T\d{6}Z(-\d+)?\.sqlite$/);

    // The live database is the backup point: the first case without its recall, the second gone.
    const restored = withDatabase(database, (db) => ({
      checks: soundness(db),
      kept: db.prepare('SELECT COUNT(*) AS n FROM surgical_case WHERE id = ?').get(kept.body.id),
      keptVisits: db.prepare('SELECT COUNT(*) AS n FROM visit WHERE case_id = ?').get(kept.body.id),
      dropped: db.prepare('SELECT COUNT(*) AS n FROM surgical_case WHERE id = ?').get(dropped.body.id),
      sessions: db.prepare('SELECT COUNT(*) AS n FROM session').get(),
    }));
    expect(restored).toEqual({ checks: { integrity: 'ok', foreignKeyViolations: [] }, kept: { n: 1 }, keptVisits: { n: 0 }, dropped: { n: 0 }, sessions: { n: 0 } });
    expect(existsSync(`${database}.restoring`)).toBe(false);
    // The safety copy holds the state the restore replaced.
    const replaced = withDatabase(safetyCopy, (db) => ({
      checks: soundness(db),
      dropped: db.prepare('SELECT COUNT(*) AS n FROM surgical_case WHERE id = ?').get(dropped.body.id),
      keptVisits: db.prepare('SELECT COUNT(*) AS n FROM visit WHERE case_id = ?').get(kept.body.id),
    }));
    expect(replaced).toEqual({ checks: { integrity: 'ok', foreignKeyViolations: [] }, dropped: { n: 1 }, keptVisits: { n: 1 } });

    // The server starts on the restored file and serves the backup point through the API.
    server = await start();
    // The cookie of the session signed in before the backup is refused: sessions were not restored.
    expect((await clinician.pointedAt(server.baseUrl).get('/api/auth/me')).status).toBe(401);
    const again = new ServerSession(server.baseUrl);
    await again.signIn(demoEmail('clinician'));
    const keptNow = await again.get<CaseDetail>(`/api/cases/${kept.body.id}`);
    expect(keptNow.status).toBe(200);
    expect(keptNow.body.visits).toEqual([]);
    expect((await again.get(`/api/cases/${dropped.body.id}`)).status).toBe(404);
  });
});

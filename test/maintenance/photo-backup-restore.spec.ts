import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { CaseDetail, PhotoView } from '@tidemark/shared';
import { caseBody } from '../api/support/clinical-fixtures';
import { demoEmail } from '../api/support/test-app';
import type { RunningServer } from '../e2e/support/server';
import { preparedDataDir, startServerOn } from './support/served-data-dir';
import { soundness, withDatabase } from './support/database-checks';
import { clinicalRows, distinctPng, photoKeysOf, photoTree } from './support/photo-files';
import { ServerSession } from './support/server-session';
import { runTsxScript, type ScriptRun } from './support/tsx-script';

/*
 * Photographs with the real server (`tsx server/main.ts` in a child process) and the CLIs as
 * `npm run backup` / `npm run restore` run them: a backup taken while photographs keep arriving,
 * then more photographs and records, then a restore that must bring back exactly the backup's
 * database and photograph files. The refusals are in photo-restore.spec.ts.
 */

/** Uploads one distinct PNG to a case as the photo form does (multipart, field `file`). */
async function uploadPhoto(session: ServerSession, caseId: number, seed: number) {
  const form = new FormData();
  form.append('kind', 'recall');
  form.append('file', new Blob([new Uint8Array(await distinctPng(seed))], { type: 'image/png' }), 'site.png');
  return session.post<PhotoView>(`/api/cases/${caseId}/photos`, form);
}

const sha256 = (bytes: Buffer): string => createHash('sha256').update(bytes).digest('hex');

describe('photographs in backup and restore with the server running', () => {
  let dataDir: string;
  let database: string;
  let uploadsDir: string;
  let server: RunningServer | null = null;
  let env: Record<string, string>;

  const start = (): Promise<RunningServer> => startServerOn(dataDir);

  beforeAll(async () => {
    ({ dataDir, database, env } = await preparedDataDir());
    uploadsDir = path.join(dataDir, 'uploads');
    server = await start();
  }, 120_000);

  afterAll(async () => {
    await server?.stop();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('backs up the photographs with the database while uploads go on, and restores both exactly as at backup', { timeout: 180_000 }, async () => {
    const running = server as RunningServer;
    const clinician = new ServerSession(running.baseUrl);
    const clinicianId = await clinician.signIn(demoEmail('clinician'));
    const created = await clinician.post<CaseDetail>('/api/cases', caseBody(clinicianId));
    expect(created.status).toBe(201);
    const caseId = created.body.id;
    let seed = 0;
    for (let index = 0; index < 3; index += 1) expect((await uploadPhoto(clinician, caseId, (seed += 1))).status).toBe(201);

    // Photographs keep arriving while `npm run backup` runs.
    const acknowledged: Array<{ id: number; at: number }> = [];
    const failures: string[] = [];
    let isUploading = true;
    const uploader = (async () => {
      while (isUploading) {
        const answer = await uploadPhoto(clinician, caseId, (seed += 1));
        if (answer.status === 201) acknowledged.push({ id: answer.body.id, at: performance.now() });
        else failures.push(`${answer.status} ${JSON.stringify(answer.body)}`);
      }
    })();
    let run: ScriptRun = { code: null, stdout: '', stderr: 'not run', durationMs: 0 };
    let startedAt = 0;
    let endedAt = 0;
    let before = new Set<number>();
    try {
      while (acknowledged.length < 2 && failures.length === 0) await new Promise((resolve) => setTimeout(resolve, 20));
      before = new Set(acknowledged.map(({ id }) => id));
      startedAt = performance.now();
      run = await runTsxScript('server/cli/backup.ts', [], env);
      endedAt = performance.now();
    } finally {
      isUploading = false;
      await uploader;
    }
    expect(failures).toEqual([]);
    expect(run.code, run.stderr).toBe(0);
    const file = /^Backup written: (.+)$/m.exec(run.stdout)?.[1] ?? '';
    const photoLine = /^Photographs: (\d+) files \([\d.]+ MB\) in (.+)\/ — (\d+) hard-linked, 0 copied\.$/m.exec(run.stdout);
    expect(photoLine, run.stdout).not.toBeNull();
    const folder = photoLine?.[2] ?? '';
    expect(folder).toBe(file.replace(/\.sqlite$/, '-photos'));
    // The server took uploads while the backup ran.
    expect(acknowledged.filter(({ at }) => at > startedAt && at < endedAt).length).toBeGreaterThan(0);

    // Consistent with the snapshot: every file the backed-up database refers to, nothing else,
    // byte for byte as stored (the photo rows keep the SHA-256 of each full-size file).
    const backedUp = withDatabase(file, (db) => ({
      keys: photoKeysOf(db),
      ids: db.prepare<[], { id: number }>('SELECT id FROM photo').all().map(({ id }) => id),
      checksums: db.prepare<[], { storage_key: string; sha256: string }>('SELECT storage_key, sha256 FROM photo').all(),
      records: clinicalRows(db),
    }));
    const tree = photoTree(folder);
    expect(Object.keys(tree)).toEqual(backedUp.keys);
    expect(Number(photoLine?.[1])).toBe(backedUp.keys.length);
    for (const { storage_key: key, sha256: expected } of backedUp.checksums) expect(sha256(readFileSync(path.join(folder, key)))).toBe(expected);
    // Every upload acknowledged before the backup began is in it.
    expect([...before].filter((id) => !backedUp.ids.includes(id))).toEqual([]);

    // After the backup: more photographs and more records.
    const later = await clinician.post<CaseDetail>('/api/cases', caseBody(clinicianId));
    expect(later.status).toBe(201);
    const laterPhoto = await uploadPhoto(clinician, later.body.id, (seed += 1));
    expect(laterPhoto.status).toBe(201);
    expect((await uploadPhoto(clinician, caseId, (seed += 1))).status).toBe(201);
    const keptPhotoId = backedUp.ids[0];

    await running.stop();
    server = null;
    const restore = await runTsxScript('server/cli/restore.ts', [file], env);
    expect(restore.code, restore.stderr).toBe(0);
    const restoredLine = /^Photographs: (\d+) files restored into (.+) from (.+) \((\d+) hard-linked, 0 copied\)\. Those of before are kept in (.+)\.$/m.exec(restore.stdout);
    expect(restoredLine, restore.stdout).not.toBeNull();
    expect(Number(restoredLine?.[1])).toBe(backedUp.keys.length);

    // The database and the photograph files are exactly as at backup.
    expect(withDatabase(database, (db) => ({ checks: soundness(db), records: clinicalRows(db) }))).toEqual({
      checks: { integrity: 'ok', foreignKeyViolations: [] },
      records: backedUp.records,
    });
    expect(photoTree(uploadsDir)).toEqual(tree);
    expect(readdirSync(dataDir).filter((name) => /^uploads\./.test(name))).toEqual([]);

    // The safety copy is a backup too: the photographs of before, the later ones included.
    const safetyCopy = /database as it was before is kept in (\S+)\.$/m.exec(restore.stdout)?.[1] ?? '';
    const safetyFolder = restoredLine?.[5] ?? '';
    expect(safetyFolder).toBe(safetyCopy.replace(/\.sqlite$/, '-photos'));
    expect(Object.keys(photoTree(safetyFolder))).toEqual(withDatabase(safetyCopy, photoKeysOf));
    expect(existsSync(path.join(safetyFolder, String(later.body.id)))).toBe(true);

    // The server starts on the restored data and serves a backed-up photograph; the later one is gone.
    server = await start();
    const again = new ServerSession(server.baseUrl);
    await again.signIn(demoEmail('clinician'));
    expect((await again.get(`/api/photos/${keptPhotoId}`)).status).toBe(200);
    expect((await again.get(`/api/photos/${laterPhoto.body.id}`)).status).toBe(404);
  });
});

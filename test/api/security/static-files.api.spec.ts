import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import nodemailer from 'nodemailer';
import request from 'supertest';
import { createApp } from '../../../server/app';
import { LocalPhotoStorage } from '../../../server/storage/photo-storage';
import { TEST_SECRET } from '../support/test-app';
import { openTestDatabase, type TestDatabase } from '../support/test-database';

/*
 * What the app serves besides /api (OWASP ASVS 5.0 13.4.1 no source-control metadata, 13.4.3 no
 * directory listings, 13.4.4 no TRACE). The app is built with a client folder laid out as in a
 * checkout (`<root>/dist/tidemark/browser`, beside `<root>/.git` and `<root>/.env`), and — the worst
 * case — with a stray `.git` folder and `.env` file copied into the client folder itself.
 */

/** Markers that may only ever appear if one of the forbidden files were sent. */
const GIT_MARKER = 'url = https://git.example.org/tidemark-secret-remote.git';
const ENV_MARKER = 'SESSION_SECRET=env-file-secret-marker';
const PAGE_MARKER = '<title>Tidemark page under test</title>';

interface StaticWorld {
  app: Express;
  root: string;
  database: TestDatabase;
}

/** Writes a file, making its folders. */
function put(file: string, text: string): void {
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, text);
}

/** A checkout-like folder with a built client, and the app serving that client (as server/main.ts does). */
async function buildWorld(): Promise<StaticWorld> {
  const root = mkdtempSync(path.join(tmpdir(), 'tidemark-static-'));
  const clientDir = path.join(root, 'dist', 'tidemark', 'browser');
  put(path.join(clientDir, 'index.html'), `<!doctype html><html><head>${PAGE_MARKER}</head><body><tm-root></tm-root></body></html>`);
  put(path.join(clientDir, 'main-ABC123.js'), 'console.log("main");');
  put(path.join(clientDir, 'media', 'work-sans-latin-400-normal.woff2'), 'font');
  put(path.join(clientDir, 'media', 'material-symbols-outlined.woff2'), 'font');
  for (const folder of [root, clientDir]) {
    put(path.join(folder, '.git', 'config'), `[remote "origin"]\n\t${GIT_MARKER}\n`);
    put(path.join(folder, '.git', 'HEAD'), 'ref: refs/heads/main\n');
    put(path.join(folder, '.env'), `${ENV_MARKER}\n`);
  }
  const database = await openTestDatabase(root);
  const { app } = createApp({
    dataSource: database.dataSource,
    secret: TEST_SECRET,
    clientDir,
    photoStorage: new LocalPhotoStorage(path.join(root, 'uploads')),
    exportsDir: path.join(root, 'exports'),
    mail: { transport: nodemailer.createTransport({ jsonTransport: true }), from: 'Tidemark <no-reply@example.org>', appUrl: 'http://localhost:3000' },
    logLevel: 'silent',
  });
  return { app, root, database };
}

/** A GET sent exactly as written (supertest would not normalise `..`, but encoded forms are spelled out here). */
function rawGet(app: Express, target: string) {
  return request(app).get(target).redirects(0);
}

describe('static files: no source-control metadata, no listings, no TRACE (ASVS 5.0 13.4.1, 13.4.3, 13.4.4)', () => {
  let world: StaticWorld;

  beforeAll(async () => {
    world = await buildWorld();
  });
  afterAll(async () => {
    await world.database.close();
    rmSync(world.root, { recursive: true, force: true });
  });

  it('serves the client page and its files (so the refusals below are not a server that serves nothing)', async () => {
    const page = await rawGet(world.app, '/');
    expect(page.status).toBe(200);
    expect(page.text).toContain(PAGE_MARKER);
    const script = await rawGet(world.app, '/main-ABC123.js');
    expect(script.status).toBe(200);
    expect(script.text).toBe('console.log("main");');
  });

  it('never sends /.git/config, /.git/HEAD or /.env, from the client folder or above it: the app page or a refusal instead', async () => {
    const targets = [
      '/.git/config',
      '/.git/HEAD',
      '/.git/',
      '/.env',
      '/%2egit/config',
      '/.git%2fconfig',
      '/..%2f..%2f..%2f.git/config',
      '/%2e%2e/%2e%2e/%2e%2e/.env',
      '/media/..%2f..%2f..%2f..%2f.env',
      '/api/../.env',
    ];
    for (const target of targets) {
      const response = await rawGet(world.app, target);
      const body = response.text ?? '';
      expect(body, target).not.toContain(GIT_MARKER);
      expect(body, target).not.toContain(ENV_MARKER);
      expect(body, target).not.toContain('refs/heads/main');
      // The single-page app's fallback (200 with index.html) or a refusal; never another file.
      if (response.status === 200) expect(body, target).toContain(PAGE_MARKER);
      else expect([400, 403, 404], target).toContain(response.status);
    }
  });

  it('lists no folder: a folder path gets the app page (or a redirect to it), never its file names', async () => {
    for (const target of ['/media/', '/media', '/media/?C=M;O=D', '/']) {
      const response = await rawGet(world.app, target);
      const body = response.text ?? '';
      expect(body, target).not.toContain('work-sans-latin-400-normal.woff2');
      expect(body, target).not.toContain('material-symbols-outlined.woff2');
      expect(body, target).not.toContain('main-ABC123.js');
      expect(body, target).not.toMatch(/Index of|Directory listing/i);
      if (response.status === 200) expect(body, target).toContain(PAGE_MARKER);
      else if (response.status === 301) expect(response.headers.location, target).toBe(`${target}/`);
      else expect(response.status, target).toBe(404);
    }
  });

  it('answers TRACE with a refusal, never echoing the request back (no message/http, no header values)', async () => {
    for (const target of ['/', '/sign-in', '/api/cases', '/api/auth/me', '/main-ABC123.js']) {
      const response = await request(world.app).trace(target).set('X-Probe', 'trace-echo-marker').set('Cookie', 'tm.sid=cookie-echo-marker');
      expect([401, 403, 404, 405], `${target}: ${response.status}`).toContain(response.status);
      expect(String(response.headers['content-type'] ?? ''), target).not.toMatch(/message\/http/);
      const body = response.text ?? '';
      expect(body, target).not.toContain('trace-echo-marker');
      expect(body, target).not.toContain('cookie-echo-marker');
      expect(body, target).not.toMatch(/^TRACE /m);
    }
  });
});

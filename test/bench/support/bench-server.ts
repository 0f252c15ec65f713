/**
 * Bench-only server entry (never used in production): the real Tidemark app from createApp on a
 * data dir seeded with the demo practice (server/demo/seed-demo.ts), behind a bare Express app
 * that answers two floor routes first, so floor and app share one process and one event loop:
 *  - `GET /bench/hello`: "hello" straight from Express, no middleware (the API throughput floor);
 *  - `GET /bench/static`: a trivial static page (the Largest Contentful Paint floor).
 * Run as a child process (test/bench/support/bench-server-process.ts starts it) with
 * BENCH_DATA_DIR set; prints `{"port": n}` on stdout once it listens on 127.0.0.1, and closes on
 * SIGTERM. Request logging is at `warn`, as in the end-to-end runs.
 */
import 'reflect-metadata';
import { randomBytes } from 'node:crypto';
import type { Server } from 'node:http';
import path from 'node:path';
import express from 'express';
import nodemailer from 'nodemailer';
import { createApp } from '../../../server/app';
import { openDatabase } from '../../../server/data-source';
import { seedDemo } from '../../../server/demo/seed-demo';
import { LocalPhotoStorage } from '../../../server/storage/photo-storage';

/** The LCP floor: one heading and one paragraph of text, nothing to fetch. */
const STATIC_PAGE = `<!doctype html>
<html lang="en-GB"><head><meta charset="utf-8"><title>Bench floor</title>
<meta name="viewport" content="width=device-width, initial-scale=1"></head>
<body><h1>Static floor page</h1><p>A trivial page served by the same process as the app, so that its paint time shows what the machine and the browser cost on their own.</p></body></html>`;

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..', '..', '..');
const dataDir = process.env.BENCH_DATA_DIR;
if (!dataDir) throw new Error('BENCH_DATA_DIR must name the (temporary) data dir.');

const dataSource = await openDatabase({ database: path.join(dataDir, 'tidemark.sqlite') });
const tidemark = createApp({
  dataSource,
  secret: randomBytes(48).toString('base64url'),
  photoStorage: new LocalPhotoStorage(path.join(dataDir, 'uploads')),
  exportsDir: path.join(dataDir, 'exports'),
  mail: { transport: nodemailer.createTransport({ jsonTransport: true }), from: 'Tidemark <no-reply@example.org>', appUrl: 'http://127.0.0.1' },
  clientDir: path.join(root, 'dist', 'tidemark', 'browser'),
  logLevel: 'warn',
});
await seedDemo(dataSource, tidemark.users, tidemark.services);

const app = express();
app.disable('x-powered-by');
app.get('/bench/hello', (_req, res) => {
  res.send('hello');
});
app.get('/bench/static', (_req, res) => {
  res.type('html').send(STATIC_PAGE);
});
app.use(tidemark.app);

const server: Server = app.listen(0, '127.0.0.1', () => {
  const address = server.address();
  if (typeof address !== 'object' || address === null) throw new Error('The bench server has no TCP address.');
  console.log(JSON.stringify({ port: address.port }));
});
process.on('SIGTERM', () => {
  server.closeAllConnections();
  server.close(() => {
    dataSource.destroy().finally(() => process.exit(0));
  });
});

import 'reflect-metadata';
import type { Server } from 'node:http';
import path from 'node:path';
import { createPhotoStorage } from './storage/create-photo-storage';
import { createApp } from './app';
import { resolveListenPort } from './listen-port';
import { loadConfig } from './config';
import { openDatabase } from './data-source';
import { seedDemo } from './demo/seed-demo';
import nodemailer from 'nodemailer';
import { SmtpStandIn } from './mail/smtp-stand-in';
import { startDailyBackups } from './maintenance/daily-backups';

/** Starts Tidemark: migrate, seed the demo on an empty database, serve app + API. */
async function main(): Promise<void> {
  const config = loadConfig();
  // PORT=0 picks a free port; it is settled now so e-mail links (APP_URL's default) name it.
  const port = await resolveListenPort(config.port);
  const dataSource = await openDatabase({ database: config.databaseFile, url: config.databaseUrl });
  // Without a configured mail server the demo captures mail locally (data/outbox).
  let standIn: SmtpStandIn | undefined;
  let smtp = config.smtp;
  if (!smtp.host && config.isDemo) {
    standIn = new SmtpStandIn(config.outboxDir);
    smtp = { ...smtp, host: '127.0.0.1', port: await standIn.start(0), secure: false };
    console.log(`Mail goes to the local stand-in on port ${smtp.port}; captured messages are kept in ${config.outboxDir}.`);
  }
  const transport = nodemailer.createTransport({
    host: smtp.host ?? '127.0.0.1',
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: !smtp.secure && Boolean(standIn),
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
  });
  const { app, sessions, users, services, exports, imports } = createApp({
    dataSource,
    secret: config.secret,
    photoStorage: createPhotoStorage(config.photoStorage),
    exportsDir: path.join(config.dataDir, 'exports'),
    mail: { transport, from: config.mailFrom, appUrl: config.appUrl ?? `http://localhost:${port}` },
    clientDir: config.clientDir,
    logLevel: config.logLevel,
    trustProxy: config.trustProxy,
    // Reached over HTTPS only: __Host- cookies, always Secure (server/auth/cookie-names.ts).
    isHttpsOnly: config.appUrl?.startsWith('https://') ?? false,
    // The demo accounts in the README must keep working without an authenticator app.
    secondFactor: config.isDemo ? 'offered' : 'required',
    // For the administrator's Settings page: kinds and places only; it never reports the SMTP password.
    installation: {
      backupsDir: config.backupsDir,
      dailyBackupsKept: config.databaseUrl ? 0 : config.dailyBackupsKept,
      isDemo: config.isDemo,
      photoStorage: config.photoStorage,
      mail: standIn ? { kind: 'stand-in' } : { kind: 'smtp', host: smtp.host ?? '127.0.0.1', port: smtp.port, secure: smtp.secure, user: smtp.user, password: smtp.password },
    },
  });
  if (config.appUrl?.startsWith('https://') && config.trustProxy === undefined) {
    console.warn('APP_URL is https://, so the cookies are Secure and __Host- prefixed: set TRUST_PROXY to the TLS proxy in front of Tidemark, or nobody can sign in.');
  }
  if (config.isDemo && (await users.count()) === 0) {
    console.log('Empty database: seeding the demo practice (demo mode; set TIDEMARK_DEMO=off to skip).');
    const report = await seedDemo(dataSource, users, services);
    console.log(`Demo practice: ${report.accounts} accounts, ${report.patients} patients, ${report.cases} cases, ${report.visits} recall visits, ${report.photos} photographs.`);
  }
  const stopPruning = sessions.startPruning();
  const stopSweepingJobs = [exports.jobs.startSweeping(), imports.jobs.startSweeping()];
  // Digests, reminders and retries: every hour (and once shortly after start).
  const runMail = (): void => {
    services.mail.runSchedules().catch((error: unknown) => console.error('Mail schedule failed:', error));
  };
  const mailTimer = setInterval(runMail, 60 * 60 * 1000);
  mailTimer.unref();
  setTimeout(runMail, 5_000).unref();
  // The SQLite file only: a PostgreSQL server is backed up with its own tools.
  const stopDailyBackups = config.databaseUrl ? () => undefined : startDailyBackups({ databaseFile: config.databaseFile, backupsDir: config.backupsDir, keep: config.dailyBackupsKept, photoStorage: config.photoStorage });
  const server: Server = app.listen(port, () => {
    console.log(`Tidemark is listening on http://localhost:${port} (data in ${config.dataDir})`);
  });
  const shutdown = (): void => {
    stopPruning();
    for (const stop of stopSweepingJobs) stop();
    clearInterval(mailTimer);
    stopDailyBackups();
    void standIn?.stop();
    server.close(() => {
      dataSource.destroy().finally(() => process.exit(0));
    });
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
}

main().catch((error: unknown) => {
  console.error('Tidemark could not start:', error);
  process.exit(1);
});

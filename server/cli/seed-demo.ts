/** `npm run seed:demo`: migrates and seeds the demo accounts into the configured data dir (idempotent). */
import 'reflect-metadata';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { createPhotoStorage } from '../storage/create-photo-storage';
import { createApp } from '../app';
import { loadConfig } from '../config';
import { openDatabase } from '../data-source';
import { seedDemo } from '../demo/seed-demo';

const config = loadConfig();
const dataSource = await openDatabase({ database: config.databaseFile, url: config.databaseUrl });
const { users, services } = createApp({ dataSource, secret: config.secret, photoStorage: createPhotoStorage(config.photoStorage), exportsDir: path.join(config.dataDir, 'exports'), mail: { transport: nodemailer.createTransport({ jsonTransport: true }), from: config.mailFrom, appUrl: 'http://localhost' }, clientDir: null, logLevel: 'silent' });
const report = await seedDemo(dataSource, users, services);
console.log(`Demo data ready in ${config.databaseUrl ? 'PostgreSQL (DATABASE_URL)' : config.databaseFile}:`, report);
await dataSource.destroy();

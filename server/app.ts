import './auth/session-types';
import { existsSync } from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express, type RequestHandler } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type { DataSource } from 'typeorm';
import { createCsrfProtection } from './auth/csrf';
import { OWASP_SCRYPT_COST, type ScryptCost } from './auth/password';
import { createPassport } from './auth/passport-setup';
import { DatabaseSessionStore } from './auth/session-store';
import { errorHandler } from './middleware/error-handler';
import { requestLogger } from './middleware/request-logger';
import type { DestinationStream } from 'pino';
import { logSessionExpired } from './logging/security-events';
import { signInAddressHash } from './logging/sign-in-address-hash';
import { secondFactorGate } from './auth/second-factor-gate';
import { SecondFactorService } from './services/second-factor.service';
import { secondFactorRoutes } from './routes/second-factor.routes';
import type { SecondFactorPolicy } from '@tidemark/shared';
import { apiNotFound } from './middleware/not-found';
import { governanceRedaction } from './middleware/governance-redaction';
import { authRoutes, DEFAULT_LOGIN_LIMITS, type LoginLimits } from './routes/auth.routes';
import { cookieNames } from './auth/cookie-names';
import { healthRoutes } from './routes/health.routes';
import { userRoutes } from './routes/users.routes';
import { passwordRoutes, type PasswordChangeLimits } from './routes/password.routes';
import { ownSessionRoutes } from './routes/own-sessions.routes';
import { OwnSessionsService } from './services/own-sessions.service';
import { caseRoutes } from './routes/cases.routes';
import { complicationRoutes, siteRoutes, visitRoutes } from './routes/clinical-edits.routes';
import { patientRoutes } from './routes/patients.routes';
import { photoRoutes } from './routes/photos.routes';
import { historyRoutes, operatorRoutes, recallRoutes } from './routes/records-overview.routes';
import { CaseService } from './services/case.service';
import { ComplicationService } from './services/complication.service';
import { HistoryService } from './services/history.service';
import { OperatorDirectory } from './services/operator-directory';
import { PatientService } from './services/patient.service';
import { PhotoService } from './services/photo.service';
import { RecallService } from './services/recall.service';
import { SiteService } from './services/site.service';
import { UserService } from './services/user.service';
import { VisitService } from './services/visit.service';
import { AuditCycleService } from './services/audit-cycle.service';
import { AuditDatasetService } from './services/audit-dataset.service';
import { AuditResultsService } from './services/audit-results.service';
import { AuditResultsCache } from './services/audit-results-cache';
import { AuditService } from './services/audit.service';
import { CalibrationService } from './services/calibration.service';
import { ScheduleService } from './services/schedule.service';
import { auditPartRoutes, auditRoutes } from './routes/audits.routes';
import { calibrationRoutes } from './routes/calibration.routes';
import { scheduleRoutes } from './routes/schedules.routes';
import type { PhotoStorage } from './storage/photo-storage';
import type { Transporter } from 'nodemailer';
import { MailService } from './services/mail.service';
import { outboxRoutes, sendPackRoutes } from './routes/mail.routes';
import { GovernanceExportService } from './export/governance-export.service';
import { GovernancePackService } from './export/governance-pack.service';
import { auditExportRoutes, exportRoutes } from './routes/exports.routes';
import { ImportService } from './import/import.service';
import { importRoutes } from './routes/imports.routes';
import { SystemOverviewService, type InstallationFacts } from './services/system-overview.service';
import { settingsRoutes } from './routes/settings.routes';

/** Idle timeout: the cookie (and the row) expire 30 minutes after the last request. */
export const SESSION_IDLE_MS = 30 * 60 * 1000;
/** Absolute limit: a session ends 8 hours after sign-in whatever the activity. */
export const SESSION_ABSOLUTE_MS = 8 * 60 * 60 * 1000;

/** Everything {@link createApp} needs; no global state, so tests can build several apps. */
export interface AppOptions {
  dataSource: DataSource;
  /** Secret for session ids and CSRF tokens (≥ 32 characters). */
  secret: string;
  /** Where photographs are kept (the data dir's uploads folder by default). */
  photoStorage: PhotoStorage;
  /** Where governance workbooks wait for download (`<dataDir>/exports`; kept one hour). */
  exportsDir: string;
  /** SMTP transport (nodemailer) for outgoing mail, and how messages link back to the app. */
  mail: { transport: Transporter; from: string; appUrl: string };
  /** Built Angular app (`dist/tidemark/browser`); null serves the API only. */
  clientDir?: string | null;
  /** Password hashing cost; tests lower it, production keeps OWASP's. */
  scryptCost?: ScryptCost;
  loginLimits?: LoginLimits;
  /**
   * The installation is reached over HTTPS only (server/main.ts: APP_URL starts with https://):
   * both cookies are always Secure and carry the `__Host-` prefix (auth/cookie-names.ts). Needs
   * TRUST_PROXY behind a TLS-terminating proxy, or express-session will not set a Secure cookie.
   */
  isHttpsOnly?: boolean;
  /** Refused own-password changes allowed per member (default 5 per 15 minutes). */
  passwordChangeLimits?: PasswordChangeLimits;
  /** pino level; 'silent' in tests. */
  logLevel?: string;
  /** Where log lines go (standard output by default; the security-log tests pass a stream). */
  logDestination?: DestinationStream;
  /** Express `trust proxy` when served behind a TLS-terminating proxy. */
  trustProxy?: boolean | number | string;
  /** One-time codes: `required` for admins and audit leads (default), or only `offered` (demo mode). */
  secondFactor?: SecondFactorPolicy;
  /** Epoch-ms clock for one-time codes; tests fix it. */
  clock?: () => number;
  /** What the administrator's Settings page reports (backups folder, demo mode, photo and mail set-up); see server/main.ts. */
  installation?: InstallationFacts;
}

/** The parts of a built app that callers (main, tests, seeds) need besides the Express app. */
export interface TidemarkApp {
  app: Express;
  sessions: DatabaseSessionStore;
  users: UserService;
  /** One-time codes and recovery codes. */
  secondFactors: SecondFactorService;
  services: ClinicalServices;
  /** Governance workbook jobs. */
  exports: GovernanceExportService;
  /** Historical import jobs. */
  imports: ImportService;
}

/** The clinical-record services, built once per app. */
export interface ClinicalServices {
  operators: OperatorDirectory;
  patients: PatientService;
  cases: CaseService;
  sites: SiteService;
  visits: VisitService;
  complications: ComplicationService;
  photos: PhotoService;
  recalls: RecallService;
  history: HistoryService;
  schedules: ScheduleService;
  audits: AuditService;
  datasets: AuditDatasetService;
  cycles: AuditCycleService;
  results: AuditResultsService;
  calibration: CalibrationService;
  mail: MailService;
}

/** Wires the services on one data source. */
export function createServices(dataSource: DataSource, photoStorage: PhotoStorage, mail: AppOptions['mail']): ClinicalServices {
  const operators = new OperatorDirectory(dataSource);
  const patients = new PatientService(dataSource);
  const cases = new CaseService(dataSource, operators, patients);
  const schedules = new ScheduleService(dataSource);
  const audits = new AuditService(dataSource, schedules, operators);
  const datasets = new AuditDatasetService(dataSource);
  const cycles = new AuditCycleService(dataSource, audits, schedules, datasets, operators);
  const recalls = new RecallService(dataSource, operators, schedules);
  return {
    mail: new MailService(dataSource, mail.transport, { from: mail.from, appUrl: mail.appUrl }, recalls),
    schedules,
    audits,
    datasets,
    cycles,
    results: new AuditResultsService(audits, cycles, operators, new AuditResultsCache(dataSource)),
    calibration: new CalibrationService(dataSource, cases),
    operators,
    patients,
    cases,
    sites: new SiteService(dataSource, cases),
    visits: new VisitService(dataSource, cases, operators, schedules),
    complications: new ComplicationService(dataSource, cases),
    photos: new PhotoService(dataSource, cases, operators, photoStorage),
    recalls,
    history: new HistoryService(dataSource, operators),
  };
}

/** `Cache-Control: no-store` on every API answer; routes that may be revalidated (photos, results) replace it. */
const noStoreByDefault: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};

/** Ends sessions older than the absolute limit, even if they were kept alive. */
const absoluteTimeout: RequestHandler = (req, _res, next) => {
  const signedInAt = req.session?.signedInAt;
  if (signedInAt && Date.now() - signedInAt > SESSION_ABSOLUTE_MS) {
    logSessionExpired(req, req.session.passport?.user, 'absolute');
    req.session.regenerate((error) => next(error));
    return;
  }
  next();
};

/** The Settings page's service, from the app's options (the backups folder defaults to `<dataDir>/backups`, beside the exports folder). */
function systemOverview(options: AppOptions): SystemOverviewService {
  const facts = options.installation ?? {};
  return new SystemOverviewService(options.dataSource, {
    backupsDir: facts.backupsDir ?? path.join(path.dirname(options.exportsDir), 'backups'),
    dailyBackupsKept: facts.dailyBackupsKept ?? 0,
    isDemo: facts.isDemo ?? false,
    photoStorage: facts.photoStorage ?? null,
    mail: facts.mail ?? null,
    mailFrom: options.mail.from,
    secondFactorPolicy: options.secondFactor ?? 'required',
    sessionIdleMs: SESSION_IDLE_MS,
    sessionAbsoluteMs: SESSION_ABSOLUTE_MS,
  });
}

/** Builds the Express app (no `listen`), so tests run it in-process. */
export function createApp(options: AppOptions): TidemarkApp {
  if (options.secret.length < 32) throw new Error('The session secret must be at least 32 characters.');
  const sessions = new DatabaseSessionStore(options.dataSource);
  const users = new UserService(options.dataSource, sessions, options.scryptCost ?? OWASP_SCRYPT_COST);
  const passport = createPassport(users, signInAddressHash(options.secret));
  const ownSessions = new OwnSessionsService(sessions, options.secret, SESSION_IDLE_MS, (userId) => users.exists(userId));
  const secondFactors = new SecondFactorService(options.dataSource, sessions, { policy: options.secondFactor ?? 'required', appSecret: options.secret, clock: options.clock });
  const cookies = cookieNames(options.isHttpsOnly ?? false);
  const csrf = createCsrfProtection(options.secret, cookies);
  const services = createServices(options.dataSource, options.photoStorage, options.mail);
  const exports = new GovernanceExportService(new GovernancePackService(options.dataSource, services.audits, services.cycles, services.operators), { exportsDir: options.exportsDir });
  const imports = new ImportService(options.dataSource, services.schedules);

  const app = express();
  app.disable('x-powered-by');
  if (options.trustProxy !== undefined) app.set('trust proxy', options.trustProxy);

  // pino-http; above `info`, where it writes no request line, only `req.log` (see the module).
  app.use(requestLogger(options.logLevel ?? 'info', options.logDestination));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          // Material and the CDK set inline styles at run time; scripts stay 'self' only.
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'img-src': ["'self'", 'data:', 'blob:'],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  app.use(express.json({ limit: '1mb' }));
  app.use(cookieParser());
  app.use(
    session({
      name: cookies.session,
      secret: options.secret,
      store: sessions,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      // Reached over HTTPS only: always Secure (required by the __Host- prefix); otherwise Secure when the request came over HTTPS.
      cookie: { httpOnly: true, sameSite: 'lax', secure: cookies.isHttpsOnly ? true : 'auto', maxAge: SESSION_IDLE_MS, path: '/' },
    }),
  );
  app.use(absoluteTimeout);
  app.use(passport.session());

  const api = express.Router();
  api.use('/health', healthRoutes(options.dataSource));
  // Clinical answers are not kept in browser or proxy caches unless a route says otherwise (ASVS 5.0 14.3.2).
  api.use(noStoreByDefault);
  api.use(csrf.middleware);
  // Before every resource: a session waiting for its code, or one that must set codes up first, reaches nothing else.
  api.use(secondFactorGate(secondFactors));
  api.use('/auth/second-factor', secondFactorRoutes(secondFactors, csrf, options.loginLimits ?? DEFAULT_LOGIN_LIMITS));
  api.use('/auth/sessions', ownSessionRoutes(ownSessions));
  api.use('/auth/password', passwordRoutes(users, services.mail, options.passwordChangeLimits));
  api.use('/auth', authRoutes(passport, csrf, options.loginLimits ?? DEFAULT_LOGIN_LIMITS, secondFactors, cookies));
  api.use('/users', userRoutes(users, secondFactors, ownSessions));
  api.use('/operators', operatorRoutes(services.operators));
  api.use('/patients', patientRoutes(services.patients));
  api.use('/cases', caseRoutes(services));
  api.use('/sites', siteRoutes(services.sites));
  api.use('/visits', visitRoutes(services.visits));
  api.use('/complications', complicationRoutes(services.complications));
  api.use('/photos', photoRoutes(services.photos));
  api.use('/recalls', recallRoutes(services.recalls));
  api.use('/history', historyRoutes(services.history));
  api.use('/schedules', scheduleRoutes(services.schedules));
  // Governance reads audits de-identified: team-written text redacted as in its workbook.
  api.use('/audits', governanceRedaction(options.dataSource));
  api.use('/audits', auditRoutes(services));
  const parts = auditPartRoutes(services);
  api.use('/standards', parts.standards);
  api.use('/cycles', parts.cycles);
  api.use('/actions', parts.actions);
  api.use('/calibration-readings', calibrationRoutes(services.calibration));
  api.use('/audits', sendPackRoutes(services.mail));
  api.use('/audits', auditExportRoutes(exports));
  api.use('/exports', exportRoutes(exports));
  api.use('/imports', importRoutes(imports));
  api.use('/outbox', outboxRoutes(services.mail));
  api.use('/settings', settingsRoutes(systemOverview(options)));
  api.use(apiNotFound);
  app.use('/api', api);

  const clientDir = options.clientDir;
  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    // The CSRF cookie is issued on the page load too, so the first POST already has it.
    app.use(csrf.middleware);
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return { app, sessions, users, secondFactors, services, exports, imports };
}

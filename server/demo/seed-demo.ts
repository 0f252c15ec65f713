import type { DataSource } from 'typeorm';
import { siteFieldsSchema, todayIso } from '@tidemark/shared';
import type { ClinicalServices } from '../app';
import { Complication } from '../entities/complication.entity';
import { Patient } from '../entities/patient.entity';
import { SiteMeasurement } from '../entities/site-measurement.entity';
import { Site } from '../entities/site.entity';
import { SurgicalCase } from '../entities/surgical-case.entity';
import { User } from '../entities/user.entity';
import { Visit } from '../entities/visit.entity';
import type { UserService } from '../services/user.service';
import { DEMO_ACCOUNTS, DEMO_OPERATORS, DEMO_PASSWORD } from './demo-accounts';
import { generateDemoPractice } from './demo-practice';
import { demoPhotograph } from './demo-photo';
import { seedDemoAudits } from './seed-demo-audits';

/** What the seed wrote. */
export interface DemoSeedReport {
  accounts: number;
  patients: number;
  cases: number;
  visits: number;
  photos: number;
}

/**
 * Seeds the demo accounts and, on a database without cases, the invented demo practice
 * (DESIGN.md §9). Idempotent: existing accounts and an existing practice are left alone.
 */
export async function seedDemo(dataSource: DataSource, users: UserService, services: ClinicalServices, today = todayIso()): Promise<DemoSeedReport> {
  const accounts = await users.ensureAll([...DEMO_ACCOUNTS, ...DEMO_OPERATORS.slice(2)], DEMO_PASSWORD);
  const report: DemoSeedReport = { accounts, patients: 0, cases: 0, visits: 0, photos: 0 };
  if ((await dataSource.getRepository(SurgicalCase).count()) > 0) return report;

  const userIds = new Map((await dataSource.getRepository(User).find()).map((user) => [user.email, user]));
  const operators = DEMO_OPERATORS.map((account) => {
    const user = userIds.get(account.email);
    if (!user) throw new Error(`Demo operator ${account.email} is missing.`);
    return user;
  });
  const practice = generateDemoPractice(today);
  const photoJobs: { caseId: number; operator: User; kinds: string[]; surgeryDate: string }[] = [];

  await dataSource.transaction(async (manager) => {
    const patientIds: number[] = [];
    for (const patient of practice.patients) {
      const saved = await manager.getRepository(Patient).save(manager.getRepository(Patient).create({ ...patient, createdById: operators[1].id, version: 1 }));
      patientIds.push(saved.id);
    }
    for (const demoCase of practice.cases) {
      const operator = operators[demoCase.operatorIndex];
      const { patientIndex, operatorIndex: _operatorIndex, sites, visits, complications, photoKinds, ...fields } = demoCase;
      const saved = await manager.getRepository(SurgicalCase).save(
        manager.getRepository(SurgicalCase).create({ ...fields, patientId: patientIds[patientIndex], operatorId: operator.id, intraOperativeEvents: '', notes: '', createdById: operator.id, version: 1 }),
      );
      // The generator is checked against the same schema a clinician's entry is.
      const siteRows = await manager.getRepository(Site).save(sites.map((site) => manager.getRepository(Site).create({ ...siteFieldsSchema.parse(site), caseId: saved.id, version: 1 })));
      const visitIds = new Map<string, number>();
      for (const visit of visits) {
        const row = await manager.getRepository(Visit).save(
          manager.getRepository(Visit).create({ caseId: saved.id, intervalKey: visit.intervalKey, visitDate: visit.visitDate, examinerId: operator.id, pain: visit.pain, satisfaction: visit.satisfaction, notes: '', version: 1 }),
        );
        visitIds.set(visit.intervalKey, row.id);
        await manager.getRepository(SiteMeasurement).insert(
          visit.measurements.map(({ siteIndex, ...measurement }) => ({ ...measurement, visitId: row.id, siteId: siteRows[siteIndex].id })),
        );
        report.visits++;
      }
      if (complications.length) {
        await manager.getRepository(Complication).insert(
          complications.map(({ intervalKey, ...complication }) => ({
            ...complication,
            caseId: saved.id,
            visitId: intervalKey ? (visitIds.get(intervalKey) ?? null) : null,
            createdById: operator.id,
            version: 1,
          })),
        );
      }
      if (photoKinds.length) photoJobs.push({ caseId: saved.id, operator, kinds: photoKinds, surgeryDate: demoCase.surgeryDate });
      report.cases++;
    }
    report.patients = patientIds.length;
  });

  // Photos go through the real upload path (content check, re-encoding, private storage).
  for (const [index, job] of photoJobs.entries()) {
    for (const kind of job.kinds) {
      const bytes = await demoPhotograph(kind === 'pre-operative' ? 'pre-operative' : 'post-operative', index);
      await services.photos.upload({ id: job.operator.id, email: job.operator.email, displayName: job.operator.displayName, role: job.operator.role }, job.caseId, bytes, {
        kind: kind === 'pre-operative' ? 'pre-operative' : 'post-operative',
        monthTaken: job.surgeryDate.slice(0, 7),
      });
      report.photos++;
    }
  }
  await seedDemoAudits(dataSource, services, today);
  return report;
}

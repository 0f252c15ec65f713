import type { DataSource } from 'typeorm';
import type { StandardCreateRequest } from '@tidemark/shared';
import { auditCreateSchema, standardCreateSchema, todayIso } from '@tidemark/shared';
import type { ClinicalServices } from '../app';
import { CalibrationReading } from '../entities/calibration-reading.entity';
import { RecallSchedule } from '../entities/recall-schedule.entity';
import { Site } from '../entities/site.entity';
import { User } from '../entities/user.entity';
import { SeededRandom } from './seeded-random';

const DAY_MS = 86_400_000;
const addDays = (date: string, days: number): string => new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);

/** Standards of the demo aesthetic audit, with the evidence a real lead would cite (REFERENCES.md §B). */
const AESTHETIC_STANDARDS: StandardCreateRequest[] = [
  {
    criterion: 'Mean rebound at 6 months is no more than 1.0 mm',
    metric: 'mean-rebound',
    intervalKey: '6m',
    comparator: '<=',
    target: 1,
    evidenceSource: 'Arora R et al., J Periodontol 2013;84(7):934–940 (0.77 ± 0.58 mm at 6 months)',
    exceptions: 'Sites re-treated before 6 months',
  },
  {
    criterion: 'At least 80% of sites rebound 1.0 mm or less at 6 months',
    metric: 'share-sites-rebound-within',
    intervalKey: '6m',
    thresholdMm: 1,
    comparator: '>=',
    target: 80,
    evidenceSource: 'Practice standard informed by Pontoriero & Carnevale, J Periodontol 2001;72(7):841–848',
  },
  {
    criterion: 'No more than 5% of cases have a complication of grade II or worse',
    metric: 'share-cases-complication-grade',
    minGrade: 'II',
    comparator: '<=',
    target: 5,
    evidenceSource: 'Grades after Dindo, Demartines & Clavien, Ann Surg 2004;240:205–213; target: practice standard',
  },
  {
    criterion: 'At least 85% of cases are seen at the 6-month recall',
    metric: 'recall-completion',
    intervalKey: '6m',
    comparator: '>=',
    target: 85,
    evidenceSource: 'Practice standard (common practice)',
  },
  {
    criterion: 'At least 90% of cases have a bleeding score under 20% before surgery',
    metric: 'share-cases-bleeding-under',
    thresholdPct: 20,
    comparator: '>=',
    target: 90,
    evidenceSource: 'Surgery only after the hygiene phase (common practice)',
  },
  {
    criterion: 'No more than 10% of patients report pain above 7 at the first recall',
    metric: 'share-patients-pain-over-7',
    comparator: '<=',
    target: 10,
    evidenceSource: 'Practice standard (common practice)',
  },
];

const RESTORATIVE_STANDARDS: StandardCreateRequest[] = [
  {
    criterion: 'At least 90% of final impressions are taken 6 weeks or more after surgery',
    metric: 'share-cases-impression-after-6w',
    comparator: '>=',
    target: 90,
    evidenceSource: 'At least 6 weeks before final impressions (common practice)',
  },
  {
    criterion: 'No more than 5% of cases have a complication of grade II or worse',
    metric: 'share-cases-complication-grade',
    minGrade: 'II',
    comparator: '<=',
    target: 5,
    evidenceSource: 'Dindo, Demartines & Clavien, Ann Surg 2004;240:205–213',
  },
];

/**
 * Two demo audits on the demo practice: aesthetic cases (a reported first cycle with an
 * action plan, and a re-audit gathering data) and restorative-access cases; plus repeated
 * readings for examiner calibration. Invented, like the practice.
 */
export async function seedDemoAudits(dataSource: DataSource, services: ClinicalServices, today = todayIso()): Promise<void> {
  const lead = await dataSource.getRepository(User).findOneByOrFail({ email: 'lead@example.org' });
  const clinician = await dataSource.getRepository(User).findOneByOrFail({ email: 'clinician@example.org' });
  const partner = await dataSource.getRepository(User).findOneByOrFail({ email: 'partner@example.org' });
  const asLead: Express.User = { id: lead.id, email: lead.email, displayName: lead.displayName, role: lead.role };
  const schedule = await dataSource.getRepository(RecallSchedule).findOneByOrFail({ isDefault: true });
  const start = addDays(today, -548);

  const aesthetic = await services.audits.create(asLead, auditCreateSchema.parse({
    title: 'Margin stability after aesthetic crown lengthening',
    rationale: 'Patients treated for excess gingival display expect the new margin to stay put. This audit checks rebound, recall attendance and complications against our standards.',
    scheduleId: schedule.id,
    thresholds: { stable: 0.5, relapse: 1 },
    cohort: { indications: ['aesthetic'], regions: ['maxillary-anterior'] },
    reauditDate: addDays(today, 120),
  }));
  for (const standard of AESTHETIC_STANDARDS) await services.audits.addStandard(asLead, aesthetic.id, standardCreateSchema.parse(standard));
  const first = await services.cycles.create(asLead, aesthetic.id, { periodStart: start, periodEnd: addDays(start, 240), notes: 'First cycle.' });
  let version = first.version;
  for (const state of ['gathering', 'weighing', 'reported'] as const) {
    version = (await services.cycles.update(asLead, first.id, { state, version, presentedDate: state === 'reported' ? addDays(today, -30) : undefined })).version;
  }
  await services.cycles.addAction(asLead, first.id, { action: 'Re-train on stent-based reference points for REF→GM readings', ownerId: clinician.id, dueDate: addDays(today, 20), state: 'under-way' });
  await services.cycles.addAction(asLead, first.id, { action: 'Book the 6-month recall at the 2-week visit for every aesthetic case', ownerId: lead.id, dueDate: addDays(today, 45), state: 'open' });
  await services.cycles.addNote({ id: partner.id, email: partner.email, displayName: partner.displayName, role: 'partner' }, aesthetic.id, {
    cycleId: first.id,
    topic: 'chart:funnel',
    text: 'One operator sits near the upper warning limit for complications; worth a case review before the re-audit.',
  });
  const second = await services.cycles.create(asLead, aesthetic.id, { periodStart: addDays(start, 241), periodEnd: today, notes: 'Re-audit after the action plan.' });
  await services.cycles.update(asLead, second.id, { state: 'gathering', version: second.version });

  const restorative = await services.audits.create(asLead, auditCreateSchema.parse({
    title: 'Restorative access: impressions and complications',
    rationale: 'Crown lengthening for caries, fracture or ferrule should heal before final impressions.',
    scheduleId: schedule.id,
    cohort: { indications: ['restorative-caries', 'restorative-fracture', 'restorative-ferrule'] },
  }));
  for (const standard of RESTORATIVE_STANDARDS) await services.audits.addStandard(asLead, restorative.id, standardCreateSchema.parse(standard));

  // Examiner calibration: two examiners read 30 sites on one day.
  const random = new SeededRandom(20261203);
  const sites = await dataSource.getRepository(Site).createQueryBuilder('s').where('s.post_op_ref_gm IS NOT NULL').orderBy('s.id', 'ASC').limit(30).getMany();
  const day = addDays(today, -14);
  const toHalf = (value: number) => Math.min(20, Math.max(0, Math.round(value * 2) / 2));
  const readings = sites.flatMap((site) => {
    const truth = (site.postOpRefGm ?? site.baselineRefGm) - 0.5;
    return [
      { siteId: site.id, examinerId: clinician.id, measuredOn: day, refGm: toHalf(truth + random.normal(0, 0.35)) },
      { siteId: site.id, examinerId: lead.id, measuredOn: day, refGm: toHalf(truth + random.normal(0, 0.35)) },
    ];
  });
  await dataSource.getRepository(CalibrationReading).insert(readings);
}

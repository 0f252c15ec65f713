/**
 * Child process of the crash-safety test: records cases and their recalls through the services,
 * in a loop, until the parent kills it (SIGKILL).
 *
 *   node --import tsx test/maintenance/support/recall-child.ts <database> <clinician e-mail> <patient-code prefix>
 *
 * Each round: a case with three sites (one transaction), then the 6-week and the 3-month recall,
 * each a visit with all three site measurements (one transaction each; the first also moves the
 * case into recall and writes a change record). Marks on stdout, written with writeSync so each
 * is in the pipe before the next statement runs: `case <id>`, `visit-begin <caseId> <interval>`,
 * `visit-end <caseId> <interval> <visitId>`.
 */
import 'reflect-metadata';
import { writeSync } from 'node:fs';
import { caseCreateSchema, visitCreateSchema } from '@tidemark/shared';
import { openDatabase } from '../../../server/data-source';
import { CaseService } from '../../../server/services/case.service';
import { OperatorDirectory } from '../../../server/services/operator-directory';
import { PatientService } from '../../../server/services/patient.service';
import { ScheduleService } from '../../../server/services/schedule.service';
import { VisitService } from '../../../server/services/visit.service';
import { storedUser } from './stored-user';

const [database, clinicianEmail, prefix] = process.argv.slice(2);
const mark = (line: string): void => {
  writeSync(1, `${line}\n`);
};
const DAY_MS = 86_400_000;
const daysAgo = (days: number): string => new Date(Date.now() - days * DAY_MS).toISOString().slice(0, 10);

const dataSource = await openDatabase({ database });
const operators = new OperatorDirectory(dataSource);
const schedules = new ScheduleService(dataSource);
const cases = new CaseService(dataSource, operators, new PatientService(dataSource));
const visits = new VisitService(dataSource, cases, operators, schedules);
const clinician = await storedUser(dataSource, clinicianEmail);
const teeth = [11, 12, 21];
mark('ready');

for (let round = 1; ; round += 1) {
  const created = await cases.create(
    clinician,
    caseCreateSchema.parse({
      patient: { code: `${prefix}-${String(round).padStart(4, '0')}`, birthYear: 1980, sex: 'female', smoking: 'never', diabetes: 'none', phenotype: 'thin', phenotypeMethod: 'probe-visibility' },
      operatorId: clinician.id,
      surgeryDate: daysAgo(120),
      procedure: 'gingivectomy',
      indication: 'aesthetic',
      instrument: 'scalpel',
      hygienePhaseComplete: true,
      status: 'operated',
      sites: teeth.map((tooth) => ({ tooth, location: 'mid-facial', referencePoint: 'incisal-edge', baselineRefGm: 8, ktWidth: 5, marginToCrest: 5, postOpRefGm: 10 })),
    }),
  );
  mark(`case ${created.id}`);
  // 6 weeks (42 days) and 3 months (91 days) after a surgery 120 days ago.
  for (const [intervalKey, daysAfterSurgery] of [['6w', 42], ['3m', 91]] as const) {
    mark(`visit-begin ${created.id} ${intervalKey}`);
    const detail = await visits.create(
      clinician,
      created.id,
      visitCreateSchema.parse({
        intervalKey,
        visitDate: daysAgo(120 - daysAfterSurgery),
        pain: 1,
        measurements: created.sites.map((site) => ({ siteId: site.id, refGm: 9.5, bleedingOnProbing: false })),
      }),
    );
    const visit = detail.visits.find((candidate) => candidate.intervalKey === intervalKey);
    mark(`visit-end ${created.id} ${intervalKey} ${visit?.id ?? 'missing'}`);
  }
}

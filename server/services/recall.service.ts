import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import type { RecallDueItem, RecallDueList, RecallInterval } from '@tidemark/shared';
import { todayIso } from '@tidemark/shared';
import { Site } from '../entities/site.entity';
import { SurgicalCase } from '../entities/surgical-case.entity';
import { Visit } from '../entities/visit.entity';
import { Patient } from '../entities/patient.entity';
import type { OperatorDirectory } from './operator-directory';
import type { ScheduleService } from './schedule.service';

/** Days ahead that count as "upcoming". */
export const UPCOMING_DAYS = 14;
const DAY_MS = 86_400_000;

/** `date` + `days` as YYYY-MM-DD (UTC calendar arithmetic). */
export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** The window of one interval for one surgery date. */
export function recallWindow(surgeryDate: string, interval: RecallInterval) {
  const targetDate = addDays(surgeryDate, interval.targetDays);
  return { targetDate, windowOpens: addDays(targetDate, -interval.windowBeforeDays), windowCloses: addDays(targetDate, interval.windowAfterDays) };
}

/**
 * Recalls that need attention: in window now, overdue (window closed, nothing recorded at
 * this or a later interval — the latest such interval only; earlier ones count as missed),
 * and upcoming (window opens within {@link UPCOMING_DAYS} days).
 */
export class RecallService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly operators: OperatorDirectory,
    private readonly schedules: ScheduleService,
  ) {}

  async due(user: Express.User, asOf = todayIso()): Promise<RecallDueList> {
    const schedule: readonly RecallInterval[] = await this.schedules.practiceSchedule();
    const where = { status: In(['operated', 'in-recall']), ...(user.role === 'clinician' ? { operatorId: user.id } : {}) };
    const cases = await this.dataSource.getRepository(SurgicalCase).find({ where, order: { surgeryDate: 'ASC' } });
    const ids = cases.map((found) => found.id);
    const [visits, sites, patients] = ids.length
      ? await Promise.all([
          this.dataSource.getRepository(Visit).find({ where: { caseId: In(ids) }, select: { caseId: true, intervalKey: true } }),
          this.dataSource.getRepository(Site).find({ where: { caseId: In(ids) }, select: { caseId: true, tooth: true } }),
          this.dataSource.getRepository(Patient).find({ where: { id: In(cases.map((found) => found.patientId)) }, select: { id: true, code: true } }),
        ])
      : [[], [], []];
    const operator = await this.operators.lookup(cases.map((found) => found.operatorId));
    const codes = new Map(patients.map((patient) => [patient.id, patient.code]));
    const list: RecallDueList = { asOf, inWindow: [], overdue: [], upcoming: [] };
    for (const found of cases) {
      const seen = new Set(visits.filter((visit) => visit.caseId === found.id).map((visit) => visit.intervalKey));
      const lastSeenIndex = Math.max(-1, ...schedule.map((interval, index) => (seen.has(interval.key) ? index : -1)));
      const teeth = [...new Set(sites.filter((site) => site.caseId === found.id).map((site) => site.tooth))].sort((a, b) => a - b);
      let overdue: RecallDueItem | undefined;
      schedule.forEach((interval, index) => {
        if (seen.has(interval.key) || index < lastSeenIndex) return;
        const window = recallWindow(found.surgeryDate, interval);
        const item = (state: RecallDueItem['state']): RecallDueItem => ({
          caseId: found.id,
          patientCode: codes.get(found.patientId) ?? '',
          operator: operator(found.operatorId),
          surgeryDate: found.surgeryDate,
          intervalKey: interval.key,
          intervalLabel: interval.label,
          ...window,
          state,
          teeth,
        });
        if (asOf >= window.windowOpens && asOf <= window.windowCloses) list.inWindow.push(item('in-window'));
        else if (asOf > window.windowCloses) overdue = item('overdue');
        else if (window.windowOpens <= addDays(asOf, UPCOMING_DAYS)) list.upcoming.push(item('upcoming'));
      });
      // Only the latest missed interval is actionable, and only while no later window is open.
      if (overdue && !list.inWindow.some((item) => item.caseId === found.id)) list.overdue.push(overdue);
    }
    list.inWindow.sort((a, b) => a.windowCloses.localeCompare(b.windowCloses));
    list.overdue.sort((a, b) => a.windowCloses.localeCompare(b.windowCloses));
    list.upcoming.sort((a, b) => a.windowOpens.localeCompare(b.windowOpens));
    return list;
  }
}

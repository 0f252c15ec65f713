import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { ROLE_LABELS, todayIso } from '@tidemark/shared';
import { ActionItem } from '../entities/action-item.entity';
import { AuditCycle } from '../entities/audit-cycle.entity';
import { Patient } from '../entities/patient.entity';
import { HttpError } from '../http-error';
import type { AuditCycleService, AuditSnapshot } from '../services/audit-cycle.service';
import type { AuditService } from '../services/audit.service';
import type { OperatorDirectory } from '../services/operator-directory';
import type { Audit } from '../entities/audit.entity';
import { composeGovernancePack } from './compose-governance-pack';
import { freeTextRedactor } from './free-text-redactor';
import type { GovernancePack, PackAction, PackScope } from './governance-pack';

/** The audit and, when asked for, its cycle. */
interface PackTarget {
  audit: Audit;
  cycle: AuditCycle | null;
}

/** Assembles the de-identified governance pack of an audit from one snapshot of its data. */
export class GovernancePackService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly audits: AuditService,
    private readonly cycles: AuditCycleService,
    private readonly operators: OperatorDirectory,
  ) {}

  /** The audit and cycle, or 404 when either is unknown or the cycle belongs to another audit. */
  async target(auditId: number, cycleId: number | null): Promise<PackTarget> {
    const audit = await this.audits.findAudit(auditId);
    if (cycleId === null) return { audit, cycle: null };
    const cycle = await this.cycles.findCycle(cycleId);
    if (cycle.auditId !== auditId) throw HttpError.notFound('The audit cycle');
    return { audit, cycle };
  }

  /** Live data, or the cycle's frozen snapshot once reported (its period of the live data before) — as the results service reads it. */
  private async snapshot({ audit, cycle }: PackTarget): Promise<AuditSnapshot> {
    if (!cycle) return this.cycles.liveSnapshot(audit);
    return this.cycles.frozenSnapshot(cycle) ?? (await this.cycles.liveSnapshot(audit, { start: cycle.periodStart, end: cycle.periodEnd }));
  }

  /** Builds the pack for `user` (whose role is named on the front page; operators are letters whoever asks). */
  async build(user: Express.User, target: PackTarget): Promise<GovernancePack> {
    const { audit, cycle } = target;
    const snapshot = await this.snapshot(target);
    const frozenAt = cycle?.frozenAt ? new Date(cycle.frozenAt).toISOString() : null;
    const scope: PackScope = cycle
      ? { kind: 'cycle', number: cycle.number, state: cycle.state, periodStart: cycle.periodStart, periodEnd: cycle.periodEnd, frozenAt, presentedDate: cycle.presentedDate }
      : { kind: 'live' };
    const lead = await this.operators.lookup([audit.leadId]);
    return composeGovernancePack(snapshot, {
      origin: { auditId: audit.id, cycleId: cycle?.id ?? null, frozenAt },
      scope,
      auditTitle: audit.title,
      rationale: audit.rationale,
      leadName: lead(audit.leadId).displayName,
      reauditDate: audit.reauditDate,
      cohort: audit.cohort,
      actions: await this.actions(audit.id, cycle),
      producedOn: todayIso(),
      producedBy: ROLE_LABELS[user.role],
      redact: freeTextRedactor(await this.patientCodes()),
    });
  }

  /** Every patient code of the practice, to keep them out of free text. */
  private async patientCodes(): Promise<string[]> {
    const rows = await this.dataSource.getRepository(Patient).find({ select: { code: true } });
    return rows.map((row) => row.code);
  }

  /** The cycle's action plan, or every cycle's for live results. */
  private async actions(auditId: number, cycle: AuditCycle | null): Promise<PackAction[]> {
    const cycles = cycle ? [cycle] : await this.dataSource.getRepository(AuditCycle).find({ where: { auditId }, order: { number: 'ASC' } });
    if (cycles.length === 0) return [];
    const numberOf = new Map(cycles.map((found) => [found.id, found.number]));
    const items = await this.dataSource.getRepository(ActionItem).find({ where: { cycleId: In(cycles.map((found) => found.id)) }, order: { dueDate: 'ASC', id: 'ASC' } });
    const people = await this.operators.lookup(items.map((item) => item.ownerId));
    return items.map((item) => ({ cycleNumber: numberOf.get(item.cycleId) ?? 0, action: item.action, owner: people(item.ownerId).displayName, dueDate: item.dueDate, state: item.state }));
  }
}

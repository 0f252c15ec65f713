import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import * as z from 'zod';
import type { AuditView, StandardView } from '@tidemark/shared';
import { auditCreateSchema, auditUpdateSchema, standardCreateSchema, standardUpdateSchema } from '@tidemark/shared';
import { ActionItem } from '../entities/action-item.entity';
import { AuditCycle } from '../entities/audit-cycle.entity';
import { AuditStandard } from '../entities/audit-standard.entity';
import { Audit } from '../entities/audit.entity';
import { User } from '../entities/user.entity';
import { HttpError } from '../http-error';
import { assertAuditReader, assertAuditWriter } from './audit-access';
import { mapCycle } from './audit-mappers';
import type { OperatorDirectory } from './operator-directory';
import type { ScheduleService } from './schedule.service';
import { mapSchedule } from './schedule.service';
import { updateWithVersion } from './versioned-update';

type AuditCreate = z.output<typeof auditCreateSchema>;
type AuditUpdate = z.output<typeof auditUpdateSchema>;
type StandardCreate = z.output<typeof standardCreateSchema>;
type StandardUpdate = z.output<typeof standardUpdateSchema>;

export function mapStandard(standard: AuditStandard): StandardView {
  return {
    id: standard.id,
    auditId: standard.auditId,
    position: standard.position,
    criterion: standard.criterion,
    metric: standard.metric,
    intervalKey: standard.intervalKey,
    thresholdMm: standard.thresholdMm,
    thresholdPct: standard.thresholdPct,
    minGrade: standard.minGrade,
    comparator: standard.comparator,
    target: standard.target,
    evidenceSource: standard.evidenceSource,
    exceptions: standard.exceptions,
    version: standard.version,
  };
}

/** Audits and their standards. Written by the audit lead; read by the clinical team and governance. */
export class AuditService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly schedules: ScheduleService,
    private readonly operators: OperatorDirectory,
  ) {}

  async findAudit(id: number): Promise<Audit> {
    const audit = await this.dataSource.getRepository(Audit).findOneBy({ id });
    if (!audit) throw HttpError.notFound('The audit');
    return audit;
  }

  async list(user: Express.User): Promise<AuditView[]> {
    assertAuditReader(user);
    const audits = await this.dataSource.getRepository(Audit).find({ order: { createdAt: 'DESC', id: 'DESC' } });
    return Promise.all(audits.map((audit) => this.view(audit)));
  }

  async get(user: Express.User, id: number): Promise<AuditView> {
    assertAuditReader(user);
    return this.view(await this.findAudit(id));
  }

  /** Standards of an audit in order. */
  async standardsOf(auditId: number): Promise<StandardView[]> {
    return (await this.dataSource.getRepository(AuditStandard).find({ where: { auditId }, order: { position: 'ASC', id: 'ASC' } })).map(mapStandard);
  }

  async view(audit: Audit): Promise<AuditView> {
    const [schedule, standards, cycles] = await Promise.all([
      this.schedules.find(audit.scheduleId),
      this.standardsOf(audit.id),
      this.dataSource.getRepository(AuditCycle).find({ where: { auditId: audit.id }, order: { number: 'ASC' } }),
    ]);
    const actions = cycles.length ? await this.dataSource.getRepository(ActionItem).find({ where: { cycleId: In(cycles.map((cycle) => cycle.id)) }, order: { dueDate: 'ASC', id: 'ASC' } }) : [];
    const people = await this.operators.lookup([audit.leadId, ...actions.map((action) => action.ownerId)]);
    return {
      id: audit.id,
      title: audit.title,
      rationale: audit.rationale,
      lead: people(audit.leadId),
      schedule: mapSchedule(schedule),
      thresholds: { stable: audit.stableThreshold, relapse: audit.relapseThreshold },
      cohort: audit.cohort,
      reauditDate: audit.reauditDate,
      version: audit.version,
      standards,
      cycles: cycles.map((cycle) => mapCycle(cycle, actions.filter((action) => action.cycleId === cycle.id), people)),
    };
  }

  private async assertLead(leadId: number): Promise<void> {
    if (!(await this.dataSource.getRepository(User).existsBy({ id: leadId, role: 'audit_lead', active: true }))) {
      throw HttpError.badRequest('Unknown audit lead.', { leadId: 'Choose an active audit lead.' });
    }
  }

  async create(user: Express.User, body: AuditCreate): Promise<AuditView> {
    assertAuditWriter(user);
    const leadId = body.leadId ?? user.id;
    await this.assertLead(leadId);
    await this.schedules.find(body.scheduleId).catch(() => {
      throw HttpError.badRequest('Unknown schedule.', { scheduleId: 'Choose a recall schedule.' });
    });
    const repository = this.dataSource.getRepository(Audit);
    const saved = await repository.save(
      repository.create({
        title: body.title,
        rationale: body.rationale,
        leadId,
        scheduleId: body.scheduleId,
        stableThreshold: body.thresholds.stable,
        relapseThreshold: body.thresholds.relapse,
        cohort: body.cohort,
        reauditDate: body.reauditDate,
        version: 1,
      }),
    );
    return this.view(saved);
  }

  async update(user: Express.User, id: number, body: AuditUpdate): Promise<AuditView> {
    assertAuditWriter(user);
    await this.findAudit(id);
    const { version, thresholds, cohort, ...rest } = body;
    if (rest.leadId !== undefined) await this.assertLead(rest.leadId);
    if (rest.scheduleId !== undefined) {
      await this.schedules.find(rest.scheduleId).catch(() => {
        throw HttpError.badRequest('Unknown schedule.', { scheduleId: 'Choose a recall schedule.' });
      });
    }
    const changes: Record<string, unknown> = Object.fromEntries(Object.entries(rest).filter(([, value]) => value !== undefined));
    if (thresholds) Object.assign(changes, { stableThreshold: thresholds.stable, relapseThreshold: thresholds.relapse });
    // `cohort` is a simple-json column: TypeORM serialises it; stringifying here stored it twice encoded.
    if (cohort) changes.cohort = cohort;
    await updateWithVersion(this.dataSource.manager, Audit, id, version, changes);
    return this.view(await this.findAudit(id));
  }

  async remove(user: Express.User, id: number): Promise<void> {
    assertAuditWriter(user);
    await this.findAudit(id);
    if (await this.dataSource.getRepository(AuditCycle).createQueryBuilder('c').where('c.audit_id = :id AND c.frozen_at IS NOT NULL', { id }).getExists()) {
      throw HttpError.conflict('This audit has reported cycles; they are part of the governance record and stay.');
    }
    await this.dataSource.getRepository(Audit).delete({ id });
  }

  /** A standard's interval must be in the audit's schedule: otherwise none of the audit's results can be computed. */
  private async assertIntervalOfSchedule(audit: Audit, intervalKey: string | null): Promise<void> {
    if (intervalKey === null) return;
    const schedule = await this.schedules.find(audit.scheduleId);
    if (!schedule.intervals.some((interval) => interval.key === intervalKey)) {
      throw HttpError.badRequest('Unknown interval.', { intervalKey: 'Choose an interval of the audit’s recall schedule.' });
    }
  }

  async addStandard(user: Express.User, auditId: number, body: StandardCreate): Promise<StandardView> {
    assertAuditWriter(user);
    await this.assertIntervalOfSchedule(await this.findAudit(auditId), body.intervalKey);
    const repository = this.dataSource.getRepository(AuditStandard);
    const position = (await repository.countBy({ auditId })) + 1;
    return mapStandard(await repository.save(repository.create({ ...body, auditId, position, version: 1 })));
  }

  private async findStandard(id: number): Promise<AuditStandard> {
    const standard = await this.dataSource.getRepository(AuditStandard).findOneBy({ id });
    if (!standard) throw HttpError.notFound('The standard');
    return standard;
  }

  async updateStandard(user: Express.User, id: number, body: StandardUpdate): Promise<StandardView> {
    assertAuditWriter(user);
    const standard = await this.findStandard(id);
    await this.assertIntervalOfSchedule(await this.findAudit(standard.auditId), body.intervalKey);
    const { version, ...change } = body;
    await updateWithVersion(this.dataSource.manager, AuditStandard, id, version, change);
    return mapStandard(await this.findStandard(id));
  }

  async removeStandard(user: Express.User, id: number): Promise<void> {
    assertAuditWriter(user);
    await this.findStandard(id);
    await this.dataSource.getRepository(AuditStandard).delete({ id });
  }
}

import type { DataSource } from 'typeorm';
import * as z from 'zod';
import type { ActionItemView, AuditDataset, CalibrationPair, CycleView, ReviewNoteView, StandardView } from '@tidemark/shared';
import { CYCLE_STATE_NEXT, actionItemCreateSchema, actionItemUpdateSchema, cycleCreateSchema, cycleUpdateSchema, reviewNoteCreateSchema, todayIso } from '@tidemark/shared';
import { ActionItem } from '../entities/action-item.entity';
import { AuditCycle } from '../entities/audit-cycle.entity';
import type { Audit } from '../entities/audit.entity';
import { ReviewNote } from '../entities/review-note.entity';
import { User } from '../entities/user.entity';
import { HttpError } from '../http-error';
import { assertAuditWriter, assertNoteReader } from './audit-access';
import type { AuditDatasetService } from './audit-dataset.service';
import { mapAction, mapCycle, mapNote } from './audit-mappers';
import type { AuditService } from './audit.service';
import type { OperatorDirectory } from './operator-directory';
import type { ScheduleService } from './schedule.service';
import { updateWithVersion } from './versioned-update';

type CycleCreate = z.output<typeof cycleCreateSchema>;
type CycleUpdate = z.output<typeof cycleUpdateSchema>;
type ActionCreate = z.output<typeof actionItemCreateSchema>;
type ActionUpdate = z.output<typeof actionItemUpdateSchema>;
type NoteCreate = z.output<typeof reviewNoteCreateSchema>;

/** What a reported cycle keeps: the data and the standards as they were when results were confirmed. */
export interface AuditSnapshot {
  dataset: AuditDataset;
  standards: StandardView[];
  calibrationPairs: CalibrationPair[];
}

/** Audit cycles, their frozen snapshots, action plans and review notes. */
export class AuditCycleService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly audits: AuditService,
    private readonly schedules: ScheduleService,
    private readonly datasets: AuditDatasetService,
    private readonly operators: OperatorDirectory,
  ) {}

  async findCycle(id: number): Promise<AuditCycle> {
    const cycle = await this.dataSource.getRepository(AuditCycle).findOneBy({ id });
    if (!cycle) throw HttpError.notFound('The audit cycle');
    return cycle;
  }

  private async view(cycle: AuditCycle): Promise<CycleView> {
    const actions = await this.dataSource.getRepository(ActionItem).find({ where: { cycleId: cycle.id }, order: { dueDate: 'ASC', id: 'ASC' } });
    return mapCycle(cycle, actions, await this.operators.lookup(actions.map((action) => action.ownerId)));
  }

  async create(user: Express.User, auditId: number, body: CycleCreate): Promise<CycleView> {
    assertAuditWriter(user);
    await this.audits.findAudit(auditId);
    const repository = this.dataSource.getRepository(AuditCycle);
    const last = await repository.findOne({ where: { auditId }, order: { number: 'DESC' } });
    const saved = await repository.save(
      repository.create({ auditId, number: (last?.number ?? 0) + 1, ...body, state: 'scoping', frozenAt: null, snapshot: null, presentedDate: null, version: 1 }),
    );
    return this.view(saved);
  }

  /** Builds what a cycle's results come from now: its period of the audit's cohort. */
  async liveSnapshot(audit: Audit, period?: { start: string; end: string }, asOf = todayIso()): Promise<AuditSnapshot> {
    const schedule = (await this.schedules.find(audit.scheduleId)).intervals;
    const dataset = await this.datasets.build({
      cohort: audit.cohort,
      schedule,
      thresholds: { stable: audit.stableThreshold, relapse: audit.relapseThreshold },
      asOf,
      period,
    });
    const siteIds = [...new Set(dataset.records.map((record) => record.siteId))];
    return { dataset, standards: await this.audits.standardsOf(audit.id), calibrationPairs: await this.datasets.calibrationPairs(siteIds) };
  }

  async update(user: Express.User, id: number, body: CycleUpdate): Promise<CycleView> {
    assertAuditWriter(user);
    const cycle = await this.findCycle(id);
    const { version, state, ...change } = body;
    if (cycle.frozenAt && (change.periodStart !== undefined || change.periodEnd !== undefined)) {
      throw HttpError.conflict('A reported cycle keeps its period: its results are frozen.');
    }
    const start = change.periodStart ?? cycle.periodStart;
    const end = change.periodEnd ?? cycle.periodEnd;
    if (start > end) throw HttpError.badRequest('The period ends before it starts.', { periodEnd: 'Must be on or after the start.' });
    const changes: Record<string, unknown> = Object.fromEntries(Object.entries(change).filter(([, value]) => value !== undefined));
    if (state !== undefined && state !== cycle.state) {
      if (!CYCLE_STATE_NEXT[cycle.state].includes(state)) {
        throw HttpError.badRequest('That stage change is not allowed.', { state: `A cycle in ${cycle.state} cannot move to ${state}.` });
      }
      changes.state = state;
      if (state === 'reported') {
        // Confirming the analysis freezes every result: later data changes never alter this cycle.
        const snapshot = await this.liveSnapshot(await this.audits.findAudit(cycle.auditId), { start, end });
        changes.snapshot = JSON.stringify(snapshot);
        changes.frozenAt = new Date();
        changes.presentedDate = change.presentedDate ?? cycle.presentedDate ?? todayIso();
      }
    }
    await updateWithVersion(this.dataSource.manager, AuditCycle, id, version, changes);
    return this.view(await this.findCycle(id));
  }

  async remove(user: Express.User, id: number): Promise<void> {
    assertAuditWriter(user);
    const cycle = await this.findCycle(id);
    if (cycle.frozenAt) throw HttpError.conflict('A reported cycle is part of the governance record and stays.');
    await this.dataSource.getRepository(AuditCycle).delete({ id });
  }

  /** The frozen snapshot of a cycle, or null while it is not reported. */
  frozenSnapshot(cycle: AuditCycle): AuditSnapshot | null {
    return cycle.snapshot ? (JSON.parse(cycle.snapshot) as AuditSnapshot) : null;
  }

  private async assertOwner(ownerId: number): Promise<void> {
    if (!(await this.dataSource.getRepository(User).existsBy({ id: ownerId, active: true }))) {
      throw HttpError.badRequest('Unknown owner.', { ownerId: 'Choose an active team member.' });
    }
  }

  async addAction(user: Express.User, cycleId: number, body: ActionCreate): Promise<ActionItemView> {
    assertAuditWriter(user);
    await this.findCycle(cycleId);
    await this.assertOwner(body.ownerId);
    const repository = this.dataSource.getRepository(ActionItem);
    const saved = await repository.save(repository.create({ ...body, cycleId, version: 1 }));
    return mapAction(saved, await this.operators.lookup([saved.ownerId]));
  }

  private async findAction(id: number): Promise<ActionItem> {
    const action = await this.dataSource.getRepository(ActionItem).findOneBy({ id });
    if (!action) throw HttpError.notFound('The action');
    return action;
  }

  async updateAction(user: Express.User, id: number, body: ActionUpdate): Promise<ActionItemView> {
    assertAuditWriter(user);
    await this.findAction(id);
    const { version, ...change } = body;
    if (change.ownerId !== undefined) await this.assertOwner(change.ownerId);
    await updateWithVersion(this.dataSource.manager, ActionItem, id, version, Object.fromEntries(Object.entries(change).filter(([, value]) => value !== undefined)));
    const saved = await this.findAction(id);
    return mapAction(saved, await this.operators.lookup([saved.ownerId]));
  }

  async removeAction(user: Express.User, id: number): Promise<void> {
    assertAuditWriter(user);
    await this.findAction(id);
    await this.dataSource.getRepository(ActionItem).delete({ id });
  }

  async notes(user: Express.User, auditId: number): Promise<ReviewNoteView[]> {
    assertNoteReader(user);
    await this.audits.findAudit(auditId);
    const notes = await this.dataSource.getRepository(ReviewNote).find({ where: { auditId }, order: { createdAt: 'DESC', id: 'DESC' } });
    const people = await this.operators.lookup(notes.map((note) => note.authorId));
    return notes.map((note) => mapNote(note, people));
  }

  async addNote(user: Express.User, auditId: number, body: NoteCreate): Promise<ReviewNoteView> {
    assertNoteReader(user);
    await this.audits.findAudit(auditId);
    if (body.cycleId !== null) {
      const cycle = await this.findCycle(body.cycleId);
      if (cycle.auditId !== auditId) throw HttpError.badRequest('Unknown cycle.', { cycleId: 'This cycle belongs to another audit.' });
    }
    const repository = this.dataSource.getRepository(ReviewNote);
    const saved = await repository.save(repository.create({ ...body, auditId, authorId: user.id }));
    return mapNote(saved, await this.operators.lookup([user.id]));
  }
}

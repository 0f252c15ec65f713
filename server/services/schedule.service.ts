import type { DataSource } from 'typeorm';
import * as z from 'zod';
import type { RecallInterval, ScheduleView } from '@tidemark/shared';
import { scheduleCreateSchema, scheduleUpdateSchema } from '@tidemark/shared';
import { Audit } from '../entities/audit.entity';
import { RecallSchedule } from '../entities/recall-schedule.entity';
import { HttpError } from '../http-error';
import { assertAuditReader, assertAuditWriter } from './audit-access';
import { updateWithVersion } from './versioned-update';

type ScheduleCreate = z.output<typeof scheduleCreateSchema>;
type ScheduleUpdate = z.output<typeof scheduleUpdateSchema>;

export function mapSchedule(schedule: RecallSchedule): ScheduleView {
  return { id: schedule.id, name: schedule.name, intervals: schedule.intervals, isDefault: Boolean(schedule.isDefault), version: schedule.version };
}

/** Recall schedules. The default one drives visit entry and the recall lists. */
export class ScheduleService {
  constructor(private readonly dataSource: DataSource) {}

  async list(user: Express.User): Promise<ScheduleView[]> {
    assertAuditReader(user);
    return (await this.dataSource.getRepository(RecallSchedule).find({ order: { id: 'ASC' } })).map(mapSchedule);
  }

  async find(id: number): Promise<RecallSchedule> {
    const schedule = await this.dataSource.getRepository(RecallSchedule).findOneBy({ id });
    if (!schedule) throw HttpError.notFound('The recall schedule');
    return schedule;
  }

  /** The practice schedule (falls back to the first one). */
  async practiceSchedule(): Promise<RecallInterval[]> {
    const repository = this.dataSource.getRepository(RecallSchedule);
    const schedule = (await repository.findOneBy({ isDefault: true })) ?? (await repository.findOne({ where: {}, order: { id: 'ASC' } }));
    if (!schedule) throw new Error('No recall schedule: the migrations seed one.');
    return schedule.intervals;
  }

  /** Every interval key any schedule knows (visits may be entered against any of them). */
  async knownIntervalKeys(): Promise<Set<string>> {
    const schedules = await this.dataSource.getRepository(RecallSchedule).find();
    return new Set(schedules.flatMap((schedule) => schedule.intervals.map((interval) => interval.key)));
  }

  async create(user: Express.User, body: ScheduleCreate): Promise<ScheduleView> {
    assertAuditWriter(user);
    const repository = this.dataSource.getRepository(RecallSchedule);
    return mapSchedule(await repository.save(repository.create({ ...body, isDefault: false, version: 1 })));
  }

  async update(user: Express.User, id: number, body: ScheduleUpdate): Promise<ScheduleView> {
    assertAuditWriter(user);
    await this.find(id);
    const { version, ...change } = body;
    const changes: Record<string, unknown> = {};
    if (change.name !== undefined) changes.name = change.name;
    // `intervals` is a simple-json column: TypeORM serialises it; stringifying here stored it twice encoded.
    if (change.intervals !== undefined) changes.intervals = change.intervals;
    await updateWithVersion(this.dataSource.manager, RecallSchedule, id, version, changes);
    return mapSchedule(await this.find(id));
  }

  async remove(user: Express.User, id: number): Promise<void> {
    assertAuditWriter(user);
    const schedule = await this.find(id);
    if (schedule.isDefault) throw HttpError.conflict('The practice schedule cannot be deleted.');
    if (await this.dataSource.getRepository(Audit).existsBy({ scheduleId: id })) throw HttpError.conflict('An audit uses this schedule.');
    await this.dataSource.getRepository(RecallSchedule).delete({ id });
  }
}

import type { DataSource } from 'typeorm';
import { z } from 'zod';
import type { ComplicationView } from '@tidemark/shared';
import { complicationCreateSchema, complicationUpdateSchema } from '@tidemark/shared';
import { Complication } from '../entities/complication.entity';
import { Visit } from '../entities/visit.entity';
import { HttpError } from '../http-error';
import { appendChanges, changedValues, diffFields } from './change-log';
import type { CaseService } from './case.service';
import { clinicalAccess } from './clinical-access';
import { mapComplication } from './clinical-mappers';
import { updateWithVersion } from './versioned-update';

type ComplicationCreate = z.output<typeof complicationCreateSchema>;
type ComplicationUpdate = z.output<typeof complicationUpdateSchema>;

/** Complications of a case (Clavien–Dindo graded). */
export class ComplicationService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
  ) {}

  async create(user: Express.User, caseId: number, body: ComplicationCreate): Promise<ComplicationView> {
    return this.dataSource.transaction(async (manager) => {
      const found = await this.cases.findCase(manager, user, caseId, 'write');
      if (body.onsetDate < found.surgeryDate) {
        throw HttpError.badRequest('A complication cannot start before the surgery.', { onsetDate: `Must be on or after ${found.surgeryDate}.` });
      }
      if (body.visitId !== null && !(await manager.getRepository(Visit).existsBy({ id: body.visitId, caseId }))) {
        throw HttpError.badRequest('Unknown visit.', { visitId: 'This visit is not part of the case.' });
      }
      const saved = await manager.getRepository(Complication).save(manager.getRepository(Complication).create({ ...body, caseId, createdById: user.id, version: 1 }));
      return mapComplication(saved);
    });
  }

  async update(user: Express.User, id: number, body: ComplicationUpdate): Promise<ComplicationView> {
    return this.dataSource.transaction(async (manager) => {
      const current = await manager.getRepository(Complication).findOneBy({ id });
      if (!current) {
        // As findCase: roles without patient-level access learn nothing about which records exist.
        clinicalAccess.assertPatientLevel(user);
        throw HttpError.notFound('The complication');
      }
      await this.cases.findCase(manager, user, current.caseId, 'write');
      const { version, reason, ...change } = body;
      const onset = change.onsetDate ?? current.onsetDate;
      const resolution = change.resolutionDate === undefined ? current.resolutionDate : change.resolutionDate;
      if (resolution !== null && resolution < onset) {
        throw HttpError.badRequest('Resolution cannot come before onset.', { resolutionDate: 'Resolution cannot come before onset.' });
      }
      const changes = diffFields(current, change);
      await updateWithVersion(manager, Complication, id, version, changedValues(changes));
      await appendChanges(manager, { entity: 'complication', entityId: id, caseId: current.caseId, userId: user.id, reason }, changes);
      return mapComplication(await manager.getRepository(Complication).findOneByOrFail({ id }));
    });
  }
}

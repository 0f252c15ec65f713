import type { DataSource } from 'typeorm';
import * as z from 'zod';
import { calibrationReadingSchema } from '@tidemark/shared';
import { CalibrationReading } from '../entities/calibration-reading.entity';
import { Site } from '../entities/site.entity';
import { HttpError } from '../http-error';
import type { CaseService } from './case.service';

type ReadingCreate = z.output<typeof calibrationReadingSchema>;

/** Repeated readings for examiner calibration, entered by those who may write the case. */
export class CalibrationService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
  ) {}

  async add(user: Express.User, body: ReadingCreate): Promise<{ id: number; siteId: number; measuredOn: string; refGm: number; examinerId: number }> {
    const site = await this.dataSource.getRepository(Site).findOneBy({ id: body.siteId });
    if (!site) {
      throw HttpError.badRequest('Unknown site.', { siteId: 'No such site.' });
    }
    await this.cases.findCase(this.dataSource.manager, user, site.caseId, 'write');
    const repository = this.dataSource.getRepository(CalibrationReading);
    const saved = await repository.save(repository.create({ ...body, examinerId: user.id }));
    return { id: saved.id, siteId: saved.siteId, measuredOn: saved.measuredOn, refGm: saved.refGm, examinerId: saved.examinerId };
  }
}

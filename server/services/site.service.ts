import type { DataSource } from 'typeorm';
import { z } from 'zod';
import type { SiteView } from '@tidemark/shared';
import { siteCreateSchema, siteUpdateSchema } from '@tidemark/shared';
import { Site } from '../entities/site.entity';
import { HttpError } from '../http-error';
import { appendChanges, changedValues, diffFields } from './change-log';
import { clinicalAccess } from './clinical-access';
import { mapSite } from './clinical-mappers';
import type { CaseService } from './case.service';
import { updateWithVersion } from './versioned-update';

type SiteCreate = z.output<typeof siteCreateSchema>;
type SiteUpdate = z.output<typeof siteUpdateSchema>;

/** Sites of a case: baseline and surgical measurements. */
export class SiteService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
  ) {}

  async add(user: Express.User, caseId: number, body: SiteCreate): Promise<SiteView> {
    return this.dataSource.transaction(async (manager) => {
      await this.cases.findCase(manager, user, caseId, 'write');
      if (await manager.getRepository(Site).existsBy({ caseId, tooth: body.tooth, location: body.location })) {
        // Bad input, not an edit race: a 400 naming the fields, as for duplicates within a new case.
        throw HttpError.badRequest('This case already has that tooth and location.', {
          tooth: `Tooth ${body.tooth} already has a ${body.location} site in this case.`,
          location: `Tooth ${body.tooth} already has a ${body.location} site in this case.`,
        });
      }
      const saved = await manager.getRepository(Site).save(manager.getRepository(Site).create({ ...body, caseId, version: 1 }));
      return mapSite(saved);
    });
  }

  /**
   * Edits a site's readings. Entering a value for the first time (null → value) needs no
   * reason; changing a recorded value does (DESIGN.md §7). Every change is kept in the history.
   */
  async update(user: Express.User, siteId: number, body: SiteUpdate): Promise<SiteView> {
    return this.dataSource.transaction(async (manager) => {
      const current = await manager.getRepository(Site).findOneBy({ id: siteId });
      if (!current) {
        // As findCase: roles without patient-level access learn nothing about which records exist.
        clinicalAccess.assertPatientLevel(user);
        throw HttpError.notFound('The site');
      }
      await this.cases.findCase(manager, user, current.caseId, 'write');
      const { version, reason, ...change } = body;
      const changes = diffFields(current, change);
      const isCorrection = changes.some((entry) => entry.oldValue !== null);
      if (isCorrection && !reason) {
        throw HttpError.badRequest('Say why a recorded value changes.', { reason: 'A reason is required to change a recorded measurement.' });
      }
      await updateWithVersion(manager, Site, siteId, version, changedValues(changes));
      await appendChanges(manager, { entity: 'site', entityId: siteId, caseId: current.caseId, userId: user.id, reason: reason ?? null }, changes);
      return mapSite(await manager.getRepository(Site).findOneByOrFail({ id: siteId }));
    });
  }
}

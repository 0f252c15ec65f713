import type { DataSource, EntityManager } from 'typeorm';
import { In, LessThan } from 'typeorm';
import { z } from 'zod';
import type { CaseDetail } from '@tidemark/shared';
import { LARGE_CHANGE_MM, visitCreateSchema, visitUpdateSchema } from '@tidemark/shared';
import { SiteMeasurement } from '../entities/site-measurement.entity';
import { Site } from '../entities/site.entity';
import type { SurgicalCase } from '../entities/surgical-case.entity';
import { SurgicalCase as SurgicalCaseEntity } from '../entities/surgical-case.entity';
import { Visit } from '../entities/visit.entity';
import { HttpError } from '../http-error';
import { appendChanges, changedValues, diffFields, type FieldChange } from './change-log';
import type { CaseService } from './case.service';
import { clinicalAccess } from './clinical-access';
import type { OperatorDirectory } from './operator-directory';
import type { ScheduleService } from './schedule.service';
import { updateWithVersion } from './versioned-update';

type VisitCreate = z.output<typeof visitCreateSchema>;
type VisitUpdate = z.output<typeof visitUpdateSchema>;
type MeasurementInput = VisitCreate['measurements'][number];
type MeasurementPatch = NonNullable<VisitUpdate['measurements']>[number];
/** Anything naming a site and perhaps a new REF→GM reading. */
type SiteReading = { siteId: number; refGm?: number };

/** Recall visits and their per-site measurements. */
export class VisitService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
    private readonly operators: OperatorDirectory,
    private readonly schedules: ScheduleService,
  ) {}

  async create(user: Express.User, caseId: number, body: VisitCreate): Promise<CaseDetail> {
    await this.dataSource.transaction(async (manager) => {
      const found = await this.cases.findCase(manager, user, caseId, 'write');
      if (found.status === 'planned' || found.status === 'withdrawn' || found.status === 'concluded') {
        throw HttpError.conflict(`A ${found.status} case does not take recall visits.`);
      }
      if (!(await this.schedules.knownIntervalKeys()).has(body.intervalKey)) {
        throw HttpError.badRequest('Unknown recall interval.', { intervalKey: 'Choose an interval of the recall schedule.' });
      }
      this.assertAfterSurgery(found, body.visitDate);
      if (await manager.getRepository(Visit).existsBy({ caseId, intervalKey: body.intervalKey })) {
        throw HttpError.conflict('This recall is already recorded. Open it to correct it.');
      }
      const examinerId = body.examinerId ?? user.id;
      if (examinerId !== user.id && !(await this.operators.isOperator(examinerId))) {
        throw HttpError.badRequest('Unknown examiner.', { examinerId: 'Choose an active clinician or audit lead.' });
      }
      const sites = await this.sitesOf(manager, caseId, body.measurements);
      await this.assertPlausibleChanges(manager, caseId, body.visitDate, sites, body.measurements, body.confirmLargeChange);
      const visit = await manager.getRepository(Visit).save(
        manager.getRepository(Visit).create({
          caseId,
          intervalKey: body.intervalKey,
          visitDate: body.visitDate,
          examinerId,
          pain: body.pain,
          satisfaction: body.satisfaction,
          notes: body.notes,
          version: 1,
        }),
      );
      await manager.getRepository(SiteMeasurement).insert(body.measurements.map((measurement) => ({ ...measurement, visitId: visit.id })));
      if (found.status === 'operated') {
        // The first recall moves the case into its recall phase.
        await manager.getRepository(SurgicalCaseEntity).update({ id: caseId }, { status: 'in-recall', version: () => 'version + 1' });
        await appendChanges(manager, { entity: 'case', entityId: caseId, caseId, userId: user.id, reason: 'First recall recorded.' }, [
          { field: 'status', oldValue: 'operated', newValue: 'in-recall' },
        ]);
      }
    });
    return this.cases.get(user, caseId);
  }

  /** Corrections after entry: always with a reason, every changed value kept in the history. */
  async update(user: Express.User, visitId: number, body: VisitUpdate): Promise<CaseDetail> {
    let caseId = 0;
    await this.dataSource.transaction(async (manager) => {
      const visit = await manager.getRepository(Visit).findOneBy({ id: visitId });
      if (!visit) {
        // As findCase: roles without patient-level access learn nothing about which records exist.
        clinicalAccess.assertPatientLevel(user);
        throw HttpError.notFound('The visit');
      }
      const found = await this.cases.findCase(manager, user, visit.caseId, 'write');
      caseId = found.id;
      const { version, reason, measurements, confirmLargeChange, ...change } = body;
      if (change.visitDate) this.assertAfterSurgery(found, change.visitDate);
      const changes = diffFields(visit, change);
      const context = { entity: 'visit', entityId: visitId, caseId: found.id, userId: user.id, reason };
      let changedMeasurements = 0;
      if (measurements) {
        const sites = await this.sitesOf(manager, found.id, measurements);
        await this.assertPlausibleChanges(manager, found.id, change.visitDate ?? visit.visitDate, sites, measurements, confirmLargeChange, visitId);
        changedMeasurements = await this.applyMeasurements(manager, visitId, measurements, { ...context, entity: 'site_measurement' });
      }
      // The visit's version guards its measurements too: two people correcting one visit cannot both win.
      await updateWithVersion(manager, Visit, visitId, version, changedValues(changes), {
        isTouched: changedMeasurements > 0,
      });
      await appendChanges(manager, context, changes);
    });
    return this.cases.get(user, caseId);
  }

  private async applyMeasurements(
    manager: EntityManager,
    visitId: number,
    measurements: MeasurementPatch[],
    context: { entity: string; caseId: number; userId: number; reason: string },
  ): Promise<number> {
    let changed = 0;
    const existing = await manager.getRepository(SiteMeasurement).findBy({ visitId });
    for (const [index, measurement] of measurements.entries()) {
      const current = existing.find((row) => row.siteId === measurement.siteId);
      if (!current) {
        // A site not measured at this visit yet: the correction adds it, so REF→GM is needed.
        if (measurement.refGm === undefined) {
          throw HttpError.badRequest('Enter REF→GM for a site added to the visit.', { [`measurements.${index}.refGm`]: 'Enter REF→GM.' });
        }
        const inserted = await manager.getRepository(SiteMeasurement).insert({
          visitId,
          siteId: measurement.siteId,
          refGm: measurement.refGm,
          probingDepth: measurement.probingDepth ?? null,
          bleedingOnProbing: measurement.bleedingOnProbing ?? null,
          ktWidth: measurement.ktWidth ?? null,
          papillaScore: measurement.papillaScore ?? null,
        });
        const id = Number(inserted.identifiers[0]?.id);
        await appendChanges(manager, { ...context, entityId: id }, [{ field: `site ${measurement.siteId}: added`, oldValue: null, newValue: measurement.refGm }]);
        changed++;
        continue;
      }
      const { siteId: _siteId, ...values } = measurement;
      const changes: FieldChange[] = diffFields(current, values);
      if (changes.length === 0) continue;
      await manager.getRepository(SiteMeasurement).update({ id: current.id }, changedValues(changes));
      await appendChanges(manager, { ...context, entityId: current.id }, changes);
      changed++;
    }
    return changed;
  }

  private assertAfterSurgery(found: SurgicalCase, visitDate: string): void {
    if (visitDate < found.surgeryDate) {
      throw HttpError.badRequest('A recall cannot come before the surgery.', { visitDate: `Must be on or after the surgery date (${found.surgeryDate}).` });
    }
  }

  /** The case's sites named by the measurements; 400 for a site of another case. */
  private async sitesOf(manager: EntityManager, caseId: number, measurements: SiteReading[]): Promise<Map<number, Site>> {
    const ids = measurements.map((measurement) => measurement.siteId);
    const sites = await manager.getRepository(Site).findBy({ id: In(ids), caseId });
    const byId = new Map(sites.map((site) => [site.id, site]));
    const fields: Record<string, string> = {};
    measurements.forEach((measurement, index) => {
      if (!byId.has(measurement.siteId)) fields[`measurements.${index}.siteId`] = 'This site is not part of the case.';
    });
    if (Object.keys(fields).length) throw HttpError.badRequest('Unknown sites.', fields);
    return byId;
  }

  /**
   * More than 3 mm of change since the previous reading (the last earlier visit, else the
   * post-op reading) usually means a different reference point: refuse unless confirmed.
   */
  private async assertPlausibleChanges(
    manager: EntityManager,
    caseId: number,
    visitDate: string,
    sites: Map<number, Site>,
    measurements: SiteReading[],
    isConfirmed: boolean,
    excludeVisitId?: number,
  ): Promise<void> {
    if (isConfirmed) return;
    const earlier = await manager.getRepository(Visit).find({ where: { caseId, visitDate: LessThan(visitDate) }, order: { visitDate: 'DESC' } });
    const earlierIds = earlier.filter((visit) => visit.id !== excludeVisitId).map((visit) => visit.id);
    const previous = earlierIds.length ? await manager.getRepository(SiteMeasurement).findBy({ visitId: In(earlierIds) }) : [];
    const fields: Record<string, string> = {};
    measurements.forEach((measurement, index) => {
      if (measurement.refGm === undefined) return;
      const refGm = measurement.refGm;
      const latest = earlierIds.map((id) => previous.find((row) => row.visitId === id && row.siteId === measurement.siteId)).find(Boolean);
      const reference = latest?.refGm ?? sites.get(measurement.siteId)?.postOpRefGm ?? null;
      if (reference !== null && Math.abs(refGm - reference) > LARGE_CHANGE_MM) {
        fields[`measurements.${index}.refGm`] = `Changed ${Math.abs(refGm - reference)} mm since ${reference} mm — check the reference point, then confirm.`;
      }
    });
    if (Object.keys(fields).length) {
      throw new HttpError(400, 'validation', `More than ${LARGE_CHANGE_MM} mm change since the last reading. Check the reference point and confirm.`, fields, {
        needsConfirmation: true,
      });
    }
  }
}

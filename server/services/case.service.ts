import type { DataSource, EntityManager } from 'typeorm';
import { In } from 'typeorm';
import { z } from 'zod';
import type { CaseDetail, CaseListItem, CaseListPage, CaseListQuery, CaseStatus, PlanningCheck } from '@tidemark/shared';
import { CASE_STATUS_NEXT, caseCreateSchema, caseUpdateSchema, todayIso } from '@tidemark/shared';
import { planningCheck } from '@tidemark/analytics';
import { ChangeRecord } from '../entities/change-record.entity';
import { Complication } from '../entities/complication.entity';
import { Patient } from '../entities/patient.entity';
import { Photo } from '../entities/photo.entity';
import { SiteMeasurement } from '../entities/site-measurement.entity';
import { Site } from '../entities/site.entity';
import { SurgicalCase } from '../entities/surgical-case.entity';
import { Visit } from '../entities/visit.entity';
import { HttpError } from '../http-error';
import { CaseListCache } from './case-list-cache';
import { appendChanges, changedValues, diffFields } from './change-log';
import { clinicalAccess } from './clinical-access';
import { asBoolean, mapChangeRecord, mapComplication, mapMeasurement, mapPatient, mapPhoto, mapSite, mapVisit } from './clinical-mappers';
import type { OperatorDirectory } from './operator-directory';
import type { PatientService } from './patient.service';
import type { GenerationCacheStats } from './generation-cache';
import { updateWithVersion } from './versioned-update';

type CaseCreate = z.output<typeof caseCreateSchema>;
type CaseUpdate = z.output<typeof caseUpdateSchema>;

const SORT_COLUMNS: Record<CaseListQuery['sort'], string> = {
  surgeryDate: 'c.surgery_date',
  patientCode: 'p.code',
  operator: 'u.display_name',
  procedure: 'c.procedure',
  status: 'c.status',
  createdAt: 'c.created_at',
};

/** Guidance messages for the planning check (DESIGN.md §3); never a decision. */
export function planningMessages(sites: Site[]): PlanningCheck[] {
  const checks: PlanningCheck[] = [];
  for (const site of sites) {
    for (const warning of planningCheck(site)) {
      checks.push({
        siteId: site.id ?? null,
        tooth: site.tooth,
        kind: warning.kind,
        message:
          warning.kind === 'keratinized-tissue'
            ? `Tooth ${site.tooth} (${site.location}): about ${warning.remaining} mm of keratinized tissue would remain, under the ${warning.threshold} mm guidance. Consider an apically positioned flap.`
            : `Tooth ${site.tooth} (${site.location}): the new margin would sit about ${warning.remaining} mm from the bone crest, under the ~${warning.threshold} mm guidance. Consider osseous recontouring.`,
      });
    }
  }
  return checks;
}

/** Cases: list, detail, registration and edits, with ownership rules and change history. */
export class CaseService {
  private readonly listCache: CaseListCache;

  constructor(
    private readonly dataSource: DataSource,
    private readonly operators: OperatorDirectory,
    private readonly patients: PatientService,
  ) {
    this.listCache = new CaseListCache(dataSource);
  }

  /** The default entity manager, for checks outside a transaction. */
  get manager(): EntityManager {
    return this.dataSource.manager;
  }

  /** Loads a case or answers 404; checks read (or write) access. */
  async findCase(manager: EntityManager, user: Express.User, id: number, access: 'read' | 'write'): Promise<SurgicalCase> {
    const found = await manager.getRepository(SurgicalCase).findOneBy({ id });
    if (!found) {
      clinicalAccess.assertPatientLevel(user);
      throw HttpError.notFound('The case');
    }
    if (access === 'write') clinicalAccess.assertCanWrite(user, found);
    else clinicalAccess.assertCanRead(user, found);
    return found;
  }

  /**
   * {@link list}'s page as the JSON bytes to send, from the case list cache while nothing it shows
   * has changed (see CaseListCache for the rule). The role check comes first, never from the cache.
   */
  async listJson(user: Express.User, query: CaseListQuery): Promise<Buffer> {
    clinicalAccess.assertPatientLevel(user);
    const ownerId = this.listOwner(user);
    return this.listCache.getOrCompute(ownerId === null ? 'all' : `operator:${ownerId}`, query, () => this.list(user, query));
  }

  /** Hits and misses of the case list cache. */
  listCacheStats(): GenerationCacheStats {
    return this.listCache.stats();
  }

  /** Whose cases `user` lists: a clinician only their own (DESIGN.md §2), the roles that read all every case (null). */
  private listOwner(user: Express.User): number | null {
    return user.role === 'clinician' ? user.id : null;
  }

  async list(user: Express.User, query: CaseListQuery): Promise<CaseListPage> {
    clinicalAccess.assertPatientLevel(user);
    const ownerId = this.listOwner(user);
    const builder = this.dataSource
      .getRepository(SurgicalCase)
      .createQueryBuilder('c')
      .innerJoin(Patient, 'p', 'p.id = c.patient_id')
      .innerJoin('user', 'u', 'u.id = c.operator_id')
      .select(['c.id AS id', 'p.code AS patient_code', 'p.phenotype AS phenotype', 'c.operator_id AS operator_id', 'u.display_name AS operator_name'])
      .addSelect(['c.surgery_date AS surgery_date', 'c.procedure AS procedure', 'c.indication AS indication', 'c.status AS status'])
      .addSelect('(SELECT COUNT(*) FROM visit v WHERE v.case_id = c.id)', 'visit_count');
    if (ownerId !== null) builder.andWhere('c.operator_id = :self', { self: ownerId });
    if (query.operatorId) builder.andWhere('c.operator_id = :operatorId', { operatorId: query.operatorId });
    if (query.procedure) builder.andWhere('c.procedure = :procedure', { procedure: query.procedure });
    if (query.status) builder.andWhere('c.status = :status', { status: query.status });
    if (query.phenotype) builder.andWhere('p.phenotype = :phenotype', { phenotype: query.phenotype });
    if (query.from) builder.andWhere('c.surgery_date >= :from', { from: query.from });
    if (query.to) builder.andWhere('c.surgery_date <= :to', { to: query.to });
    if (query.tooth) builder.andWhere('EXISTS (SELECT 1 FROM site s WHERE s.case_id = c.id AND s.tooth = :tooth)', { tooth: query.tooth });
    if (query.patientCode) builder.andWhere('p.code LIKE :code', { code: `%${query.patientCode.toUpperCase().replace(/[%_]/g, '')}%` });

    const offset = query.page * query.pageSize;
    const rows = await builder
      .clone()
      .orderBy(SORT_COLUMNS[query.sort], query.direction === 'asc' ? 'ASC' : 'DESC')
      .addOrderBy('c.id', 'DESC')
      .offset(offset)
      .limit(query.pageSize)
      .getRawMany<Record<string, string | number>>();
    // A page that is neither full nor empty is the last one: its end is the total, no count needed.
    const isLastPage = rows.length > 0 && rows.length < query.pageSize;
    const total = isLastPage ? offset + rows.length : await builder.getCount();
    const ids = rows.map((row) => Number(row.id));
    // Raw rows, one per distinct tooth: hydrating Site entities cost more than the query itself.
    const sites = ids.length
      ? await this.dataSource
          .createQueryBuilder()
          .select('s.case_id', 'case_id')
          .addSelect('s.tooth', 'tooth')
          .distinct(true)
          .from('site', 's')
          .where('s.case_id IN (:...ids)', { ids })
          .getRawMany<{ case_id: number; tooth: number }>()
      : [];
    const teethByCase = new Map<number, Set<number>>();
    for (const site of sites) {
      const caseId = Number(site.case_id);
      const teeth = teethByCase.get(caseId) ?? new Set<number>();
      teeth.add(Number(site.tooth));
      teethByCase.set(caseId, teeth);
    }
    const items: CaseListItem[] = rows.map((row) => ({
      id: Number(row.id),
      patientCode: String(row.patient_code),
      operator: { id: Number(row.operator_id), displayName: String(row.operator_name) },
      surgeryDate: String(row.surgery_date),
      procedure: row.procedure as CaseListItem['procedure'],
      indication: row.indication as CaseListItem['indication'],
      status: row.status as CaseStatus,
      phenotype: row.phenotype as CaseListItem['phenotype'],
      teeth: [...(teethByCase.get(Number(row.id)) ?? [])].sort((a, b) => a - b),
      visitCount: Number(row.visit_count),
    }));
    return { items, total };
  }

  async get(user: Express.User, id: number): Promise<CaseDetail> {
    const found = await this.findCase(this.dataSource.manager, user, id, 'read');
    return this.detail(found);
  }

  /** Assembles the whole case; outcomes come from analytics/. */
  async detail(found: SurgicalCase): Promise<CaseDetail> {
    const manager = this.dataSource.manager;
    const [patient, sites, visits, complications, photos, history] = await Promise.all([
      manager.getRepository(Patient).findOneByOrFail({ id: found.patientId }),
      manager.getRepository(Site).find({ where: { caseId: found.id }, order: { tooth: 'ASC', location: 'ASC' } }),
      manager.getRepository(Visit).find({ where: { caseId: found.id }, order: { visitDate: 'ASC' } }),
      manager.getRepository(Complication).find({ where: { caseId: found.id }, order: { onsetDate: 'ASC' } }),
      manager.getRepository(Photo).find({ where: { caseId: found.id }, order: { createdAt: 'ASC' } }),
      manager.getRepository(ChangeRecord).find({ where: { caseId: found.id }, order: { changedAt: 'DESC', id: 'DESC' } }),
    ]);
    const measurements = visits.length ? await manager.getRepository(SiteMeasurement).findBy({ visitId: In(visits.map((visit) => visit.id)) }) : [];
    const siteById = new Map(sites.map((site) => [site.id, site]));
    const operator = await this.operators.lookup([
      found.operatorId,
      ...visits.map((visit) => visit.examinerId),
      ...photos.map((photo) => photo.uploadedById),
      ...history.map((record) => record.changedById),
    ]);
    return {
      id: found.id,
      patient: mapPatient(patient),
      operator: operator(found.operatorId),
      surgeryDate: found.surgeryDate,
      procedure: found.procedure,
      indication: found.indication,
      instrument: found.instrument,
      hygienePhaseComplete: Boolean(found.hygienePhaseComplete),
      bleedingScorePct: found.bleedingScorePct,
      plaqueScorePct: found.plaqueScorePct,
      deepestProbingMm: found.deepestProbingMm,
      sutureResorbable: asBoolean(found.sutureResorbable),
      sutureSize: found.sutureSize,
      provisionalRestorations: Boolean(found.provisionalRestorations),
      intraOperativeEvents: found.intraOperativeEvents,
      finalImpressionDate: found.finalImpressionDate,
      finalRestorationDate: found.finalRestorationDate,
      status: found.status,
      withdrawnReason: found.withdrawnReason,
      notes: found.notes,
      version: found.version,
      sites: sites.map(mapSite),
      visits: visits.map((visit) =>
        mapVisit(
          visit,
          measurements
            .filter((measurement) => measurement.visitId === visit.id)
            .flatMap((measurement) => {
              const site = siteById.get(measurement.siteId);
              return site ? [mapMeasurement(measurement, site)] : [];
            }),
          operator,
        ),
      ),
      complications: complications.map(mapComplication),
      photos: photos.map((photo) => mapPhoto(photo, operator)),
      history: history.map((record) => mapChangeRecord(record, operator)),
      planningChecks: planningMessages(sites),
    };
  }

  async create(user: Express.User, body: CaseCreate): Promise<CaseDetail> {
    clinicalAccess.assertWriter(user);
    clinicalAccess.assertPatientLevel(user);
    if (user.role === 'clinician' && body.operatorId !== user.id) {
      throw HttpError.badRequest('Clinicians record their own cases.', { operatorId: 'Choose yourself as the operator.' });
    }
    if (!(await this.operators.isOperator(body.operatorId))) {
      throw HttpError.badRequest('Unknown operator.', { operatorId: 'Choose an active clinician or audit lead.' });
    }
    if (body.status === 'operated' && body.surgeryDate > todayIso()) {
      throw HttpError.badRequest('An operated case cannot have a future surgery date.', { surgeryDate: 'Cannot be in the future for an operated case.' });
    }
    this.assertDateOrder(body.surgeryDate, body.finalImpressionDate, body.finalRestorationDate);
    const created = await this.dataSource.transaction(async (manager) => {
      const patientId = body.patient
        ? (await this.patients.insert(manager, user, body.patient)).id
        : (await this.patients.findVisible(manager, user, body.patientId as number)).id;
      const { patient: _patient, patientId: _patientId, sites, ...fields } = body;
      const saved = await manager.getRepository(SurgicalCase).save(
        manager.getRepository(SurgicalCase).create({ ...fields, patientId, withdrawnReason: null, createdById: user.id, version: 1 }),
      );
      await manager.getRepository(Site).insert(sites.map((site) => ({ ...site, caseId: saved.id, version: 1 })));
      return saved;
    });
    return this.detail(created);
  }

  async update(user: Express.User, id: number, body: CaseUpdate): Promise<CaseDetail> {
    await this.dataSource.transaction(async (manager) => {
      const current = await this.findCase(manager, user, id, 'write');
      const { version, reason, ...change } = body;
      if (change.status !== undefined && change.status !== current.status && !CASE_STATUS_NEXT[current.status].includes(change.status)) {
        throw HttpError.badRequest('That status change is not allowed.', { status: `A ${current.status} case cannot become ${change.status}.` });
      }
      if (change.status === 'withdrawn' && current.status !== 'withdrawn') change.withdrawnReason = change.withdrawnReason ?? '';
      else delete change.withdrawnReason;
      const nextStatus = change.status ?? current.status;
      const nextSurgeryDate = change.surgeryDate ?? current.surgeryDate;
      // The same rule as on registration: once operated, the surgery cannot lie in the future.
      if (nextStatus !== 'planned' && nextStatus !== 'withdrawn' && nextSurgeryDate > todayIso()) {
        throw HttpError.badRequest('An operated case cannot have a future surgery date.', { surgeryDate: 'Cannot be in the future for an operated case.' });
      }
      const keep = <T>(next: T | undefined, previous: T): T => (next === undefined ? previous : next);
      this.assertDateOrder(nextSurgeryDate, keep(change.finalImpressionDate, current.finalImpressionDate), keep(change.finalRestorationDate, current.finalRestorationDate));
      if (change.surgeryDate !== undefined) {
        const firstVisit = await manager.getRepository(Visit).findOne({ where: { caseId: id }, order: { visitDate: 'ASC' } });
        if (firstVisit && change.surgeryDate > firstVisit.visitDate) {
          throw HttpError.badRequest('The surgery cannot come after a recorded recall.', { surgeryDate: `Must be on or before the first recall (${firstVisit.visitDate}).` });
        }
      }
      const changes = diffFields(current, change);
      await updateWithVersion(manager, SurgicalCase, id, version, changedValues(changes));
      await appendChanges(manager, { entity: 'case', entityId: id, caseId: id, userId: user.id, reason }, changes);
    });
    return this.get(user, id);
  }

  private assertDateOrder(surgeryDate: string, finalImpressionDate: string | null, finalRestorationDate: string | null): void {
    const fields: Record<string, string> = {};
    if (finalImpressionDate && finalImpressionDate < surgeryDate) fields.finalImpressionDate = 'Cannot be before the surgery.';
    if (finalRestorationDate && finalRestorationDate < surgeryDate) fields.finalRestorationDate = 'Cannot be before the surgery.';
    if (finalRestorationDate && finalImpressionDate && finalRestorationDate < finalImpressionDate) fields.finalRestorationDate = 'Cannot be before the final impression.';
    if (Object.keys(fields).length) throw HttpError.badRequest('Some dates are out of order.', fields);
  }
}

import type { DataSource } from 'typeorm';
import type { AuditCaseRecord, AuditDataset, CalibrationPair, CohortDefinition, CohortPreview, OutcomeRecord, RecallInterval, StabilityThresholds } from '@tidemark/shared';
import { REGIONS, regionOfTooth } from '@tidemark/shared';
import { isValidFdiTooth } from '@tidemark/analytics';

/** What to read: the cohort, optionally narrowed to a cycle's period of surgery dates. */
export interface DatasetRequest {
  cohort: CohortDefinition;
  schedule: readonly RecallInterval[];
  thresholds: StabilityThresholds;
  asOf: string;
  period?: { start: string; end: string };
}

interface CaseRow {
  id: number;
  patient_id: number;
  operator_id: number;
  surgery_date: string;
  procedure: AuditCaseRecord['procedure'];
  indication: AuditCaseRecord['indication'];
  status: string;
  bleeding_score_pct: number | null;
  final_impression_date: string | null;
  phenotype: AuditCaseRecord['phenotype'];
  smoking: AuditCaseRecord['smoking'];
  diabetes: AuditCaseRecord['diabetes'];
}

const ALL_TEETH: readonly number[] = Array.from({ length: 89 }, (_, index) => index).filter((tooth) => isValidFdiTooth(tooth));

/** Teeth selected by the cohort's regions and teeth lists (null: every tooth). */
export function selectedTeeth(cohort: CohortDefinition): Set<number> | null {
  if (cohort.regions.length === 0 && cohort.teeth.length === 0) return null;
  const teeth = new Set<number>(cohort.teeth);
  const regions = new Set(cohort.regions.filter((region) => (REGIONS as readonly string[]).includes(region)));
  for (const tooth of ALL_TEETH) if (regions.has(regionOfTooth(tooth))) teeth.add(tooth);
  return teeth;
}

/** Builds an audit's dataset from the database: the cohort's cases, sites, visits and complications. */
export class AuditDatasetService {
  constructor(private readonly dataSource: DataSource) {}

  private async cohortCases(cohort: CohortDefinition, period?: { start: string; end: string }): Promise<CaseRow[]> {
    const builder = this.dataSource
      .createQueryBuilder()
      .select(['c.id AS id', 'c.patient_id AS patient_id', 'c.operator_id AS operator_id', 'c.surgery_date AS surgery_date', 'c.procedure AS procedure'])
      .addSelect(['c.indication AS indication', 'c.status AS status', 'c.bleeding_score_pct AS bleeding_score_pct', 'c.final_impression_date AS final_impression_date'])
      .addSelect(['p.phenotype AS phenotype', 'p.smoking AS smoking', 'p.diabetes AS diabetes'])
      .from('surgical_case', 'c')
      .innerJoin('patient', 'p', 'p.id = c.patient_id')
      // Planned cases have no surgery yet, so nothing to audit.
      .where("c.status <> 'planned'");
    const from = [cohort.surgeryFrom, period?.start].filter((value): value is string => Boolean(value)).sort().pop();
    const to = [cohort.surgeryTo, period?.end].filter((value): value is string => Boolean(value)).sort().shift();
    if (from) builder.andWhere('c.surgery_date >= :from', { from });
    if (to) builder.andWhere('c.surgery_date <= :to', { to });
    if (cohort.procedures.length) builder.andWhere('c.procedure IN (:...procedures)', { procedures: cohort.procedures });
    if (cohort.operatorIds.length) builder.andWhere('c.operator_id IN (:...operatorIds)', { operatorIds: cohort.operatorIds });
    if (cohort.phenotypes.length) builder.andWhere('p.phenotype IN (:...phenotypes)', { phenotypes: cohort.phenotypes });
    if (cohort.indications.length) builder.andWhere('c.indication IN (:...indications)', { indications: cohort.indications });
    if (cohort.smoking.length) builder.andWhere('p.smoking IN (:...smoking)', { smoking: cohort.smoking });
    if (cohort.diabetes.length) builder.andWhere('p.diabetes IN (:...diabetes)', { diabetes: cohort.diabetes });
    const teeth = selectedTeeth(cohort);
    if (teeth) builder.andWhere('EXISTS (SELECT 1 FROM site s WHERE s.case_id = c.id AND s.tooth IN (:...teeth))', { teeth: [...teeth] });
    return builder.orderBy('c.surgery_date', 'ASC').addOrderBy('c.id', 'ASC').getRawMany<CaseRow>();
  }

  /** The live cohort size while a definition is edited. */
  async preview(cohort: CohortDefinition): Promise<CohortPreview> {
    const cases = await this.cohortCases(cohort);
    if (cases.length === 0) return { cases: 0, patients: 0, sites: 0 };
    const teeth = selectedTeeth(cohort);
    const builder = this.dataSource.createQueryBuilder().select('COUNT(*)', 'n').from('site', 's').where('s.case_id IN (:...ids)', { ids: cases.map((row) => row.id) });
    if (teeth) builder.andWhere('s.tooth IN (:...teeth)', { teeth: [...teeth] });
    const sites = await builder.getRawOne<{ n: number }>();
    return { cases: cases.length, patients: new Set(cases.map((row) => row.patient_id)).size, sites: Number(sites?.n ?? 0) };
  }

  async build(request: DatasetRequest): Promise<AuditDataset> {
    const caseRows = await this.cohortCases(request.cohort, request.period);
    const ids = caseRows.map((row) => row.id);
    const empty: AuditDataset = { asOf: request.asOf, schedule: request.schedule, thresholds: request.thresholds, records: [], cases: [] };
    if (ids.length === 0) return empty;
    const teeth = selectedTeeth(request.cohort);
    const chunks = chunk(ids, 500);
    const sites: { id: number; case_id: number; tooth: number; location: OutcomeRecord['location']; baseline_ref_gm: number; post_op_ref_gm: number | null; papilla_score: number | null }[] = [];
    const visits: { id: number; case_id: number; interval_key: string; visit_date: string; pain: number | null }[] = [];
    const complications: { case_id: number; type: string; grade: AuditCaseRecord['complications'][number]['grade'] }[] = [];
    for (const part of chunks) {
      const siteQuery = this.dataSource
        .createQueryBuilder()
        .select(['s.id AS id', 's.case_id AS case_id', 's.tooth AS tooth', 's.location AS location', 's.baseline_ref_gm AS baseline_ref_gm', 's.post_op_ref_gm AS post_op_ref_gm', 's.papilla_score AS papilla_score'])
        .from('site', 's')
        .where('s.case_id IN (:...ids)', { ids: part });
      if (teeth) siteQuery.andWhere('s.tooth IN (:...teeth)', { teeth: [...teeth] });
      sites.push(...(await siteQuery.getRawMany()));
      visits.push(
        ...(await this.dataSource
          .createQueryBuilder()
          .select(['v.id AS id', 'v.case_id AS case_id', 'v.interval_key AS interval_key', 'v.visit_date AS visit_date', 'v.pain AS pain'])
          .from('visit', 'v')
          .where('v.case_id IN (:...ids)', { ids: part })
          .andWhere('v.visit_date <= :asOf', { asOf: request.asOf })
          .getRawMany()),
      );
      complications.push(
        ...(await this.dataSource
          .createQueryBuilder()
          .select(['x.case_id AS case_id', 'x.type AS type', 'x.grade AS grade'])
          .from('complication', 'x')
          .where('x.case_id IN (:...ids)', { ids: part })
          .andWhere('x.onset_date <= :asOf', { asOf: request.asOf })
          .getRawMany()),
      );
    }
    const measurements: { visit_id: number; site_id: number; ref_gm: number; papilla_score: number | null; bleeding_on_probing: number | boolean | null }[] = [];
    for (const part of chunk(visits.map((visit) => visit.id), 500)) {
      measurements.push(
        ...(await this.dataSource
          .createQueryBuilder()
          .select(['m.visit_id AS visit_id', 'm.site_id AS site_id', 'm.ref_gm AS ref_gm', 'm.papilla_score AS papilla_score', 'm.bleeding_on_probing AS bleeding_on_probing'])
          .from('site_measurement', 'm')
          .where('m.visit_id IN (:...ids)', { ids: part })
          .getRawMany()),
      );
    }
    const caseById = new Map(caseRows.map((row) => [row.id, row]));
    const siteById = new Map(sites.map((site) => [site.id, site]));
    const visitById = new Map(visits.map((visit) => [visit.id, visit]));
    const records: OutcomeRecord[] = [];
    for (const measurement of measurements) {
      const site = siteById.get(measurement.site_id);
      const visit = visitById.get(measurement.visit_id);
      const found = visit ? caseById.get(visit.case_id) : undefined;
      if (!site || !visit || !found) continue;
      records.push({
        caseId: found.id,
        patientId: found.patient_id,
        operatorId: found.operator_id,
        phenotype: found.phenotype,
        procedure: found.procedure,
        indication: found.indication,
        smoking: found.smoking,
        surgeryDate: found.surgery_date,
        siteId: site.id,
        tooth: site.tooth,
        location: site.location,
        baselineRefGm: site.baseline_ref_gm,
        postOpRefGm: site.post_op_ref_gm,
        baselinePapilla: site.papilla_score,
        intervalKey: visit.interval_key,
        visitDate: visit.visit_date,
        recallRefGm: measurement.ref_gm,
        recallPapilla: measurement.papilla_score,
        bleedingOnProbing: measurement.bleeding_on_probing === null ? null : Boolean(measurement.bleeding_on_probing),
      });
    }
    const visitsByCase = groupBy(visits, (visit) => visit.case_id);
    const complicationsByCase = groupBy(complications, (complication) => complication.case_id);
    const cases: AuditCaseRecord[] = caseRows.map((row) => {
      const own = visitsByCase.get(row.id) ?? [];
      return {
        caseId: row.id,
        patientId: row.patient_id,
        operatorId: row.operator_id,
        surgeryDate: row.surgery_date,
        isWithdrawn: row.status === 'withdrawn',
        complications: (complicationsByCase.get(row.id) ?? []).map(({ type, grade }) => ({ type, grade })),
        visits: own.map((visit) => ({ intervalKey: visit.interval_key, visitDate: visit.visit_date })),
        procedure: row.procedure,
        indication: row.indication,
        phenotype: row.phenotype,
        smoking: row.smoking,
        diabetes: row.diabetes,
        bleedingScorePct: row.bleeding_score_pct,
        finalImpressionDate: row.final_impression_date,
        painByInterval: Object.fromEntries(own.filter((visit) => visit.pain !== null).map((visit) => [visit.interval_key, Number(visit.pain)])),
      };
    });
    return { ...empty, records, cases };
  }

  /** Pairs of repeated readings of the cohort's sites (same site, same day: the first two readings). */
  async calibrationPairs(siteIds: readonly number[]): Promise<CalibrationPair[]> {
    const readings: { site_id: number; measured_on: string; examiner_id: number; ref_gm: number }[] = [];
    for (const part of chunk([...siteIds], 500)) {
      readings.push(
        ...(await this.dataSource
          .createQueryBuilder()
          .select(['r.site_id AS site_id', 'r.measured_on AS measured_on', 'r.examiner_id AS examiner_id', 'r.ref_gm AS ref_gm'])
          .from('calibration_reading', 'r')
          .where('r.site_id IN (:...ids)', { ids: part })
          .orderBy('r.id', 'ASC')
          .getRawMany()),
      );
    }
    const groups = groupBy(readings, (reading) => `${reading.site_id}|${reading.measured_on}`);
    const pairs: CalibrationPair[] = [];
    for (const group of groups.values()) {
      if (group.length < 2) continue;
      const [first, second] = group;
      pairs.push({ siteId: first.site_id, measuredOn: first.measured_on, first: first.ref_gm, second: second.ref_gm, isSameExaminer: first.examiner_id === second.examiner_id });
    }
    return pairs;
  }
}

function groupBy<T, K>(values: readonly T[], keyOf: (value: T) => K): Map<K, T[]> {
  const groups = new Map<K, T[]>();
  for (const value of values) {
    const key = keyOf(value);
    const group = groups.get(key);
    if (group) group.push(value);
    else groups.set(key, [value]);
  }
  return groups;
}

function chunk<T>(values: readonly T[], size: number): T[][] {
  const parts: T[][] = [];
  for (let index = 0; index < values.length; index += size) parts.push(values.slice(index, index + size));
  return parts;
}

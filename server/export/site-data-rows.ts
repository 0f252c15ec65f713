import type { AuditDataset, OutcomeRecord, Phenotype } from '@tidemark/shared';
import { PHENOTYPE_LABELS, PROCEDURE_LABELS, SITE_LOCATION_LABELS } from '@tidemark/shared';
import { crownGain, siteOutcome } from '@tidemark/analytics';
import type { SiteDataRow, SiteDataSource } from './governance-pack';

/** `P0001`, `C0042`: at least four digits, more when the export needs them. */
function exportCode(prefix: string, number: number): string {
  return `${prefix}${String(number).padStart(4, '0')}`;
}

function labelOf(labels: Readonly<Record<string, string>>, key: string): string {
  return labels[key] ?? key;
}

function phenotypeLabel(phenotype: Phenotype | null): string {
  return phenotype === null ? 'Not recorded' : labelOf(PHENOTYPE_LABELS, phenotype);
}

/**
 * The Site data sheet's rows: one per site per recall, in order of surgery, case, tooth, site and
 * interval. Patients and cases get codes that exist only in this export (P0001…, C0001…, in order
 * of first appearance), operators their letter, dates their month; outcomes come from analytics'
 * siteOutcome and crownGain. Rows are made one at a time as the sheet is written.
 */
export function siteDataSource(dataset: AuditDataset, operatorLetter: (operatorId: number) => string): SiteDataSource {
  const records = dataset.records;
  const intervalOrder = new Map(dataset.schedule.map((interval, index) => [interval.key, index]));
  const intervalLabel = new Map(dataset.schedule.map((interval) => [interval.key, interval.label]));
  const rank = (record: OutcomeRecord): number => intervalOrder.get(record.intervalKey) ?? dataset.schedule.length;
  // Sort positions rather than records: the records stay where they are and nothing is copied.
  const order = Uint32Array.from(records.keys()).sort((left, right) => {
    const a = records[left];
    const b = records[right];
    return (
      (a.surgeryDate < b.surgeryDate ? -1 : a.surgeryDate > b.surgeryDate ? 1 : 0) ||
      a.caseId - b.caseId ||
      a.tooth - b.tooth ||
      (a.location < b.location ? -1 : a.location > b.location ? 1 : 0) ||
      a.siteId - b.siteId ||
      rank(a) - rank(b)
    );
  });
  return {
    count: records.length,
    *rows(): Iterable<SiteDataRow> {
      const patientCodes = new Map<number, string>();
      const caseCodes = new Map<number, string>();
      for (const position of order) {
        const record = records[position];
        let patient = patientCodes.get(record.patientId);
        if (patient === undefined) {
          patient = exportCode('P', patientCodes.size + 1);
          patientCodes.set(record.patientId, patient);
        }
        let caseCode = caseCodes.get(record.caseId);
        if (caseCode === undefined) {
          caseCode = exportCode('C', caseCodes.size + 1);
          caseCodes.set(record.caseId, caseCode);
        }
        const outcome = record.recallRefGm === null ? null : siteOutcome({ baselineRefGm: record.baselineRefGm, postOpRefGm: record.postOpRefGm, recallRefGm: record.recallRefGm }, dataset.thresholds);
        yield {
          patient,
          caseCode,
          operator: operatorLetter(record.operatorId),
          tooth: record.tooth,
          location: labelOf(SITE_LOCATION_LABELS, record.location),
          phenotype: phenotypeLabel(record.phenotype),
          procedure: labelOf(PROCEDURE_LABELS, record.procedure),
          surgeryMonth: record.surgeryDate.slice(0, 7),
          visitMonth: record.visitDate.slice(0, 7),
          interval: intervalLabel.get(record.intervalKey) ?? record.intervalKey,
          baselineRefGm: record.baselineRefGm,
          postOpRefGm: record.postOpRefGm,
          recallRefGm: record.recallRefGm,
          crownGain: record.postOpRefGm === null ? null : crownGain(record.baselineRefGm, record.postOpRefGm),
          rebound: outcome?.rebound ?? null,
          retainedGain: outcome?.retainedGain ?? null,
          percentRetained: outcome?.percentRetained ?? null,
          stability: outcome?.stability ?? null,
          isFlaggedForReview: outcome?.isFlaggedForReview ?? false,
          baselinePapilla: record.baselinePapilla,
          recallPapilla: record.recallPapilla,
          bleedingOnProbing: record.bleedingOnProbing,
        };
      }
    },
  };
}

/**
 * A small invented audit (not demo data) shared by the audit-level specs; every figure
 * the specs expect is worked out by hand from this table, in the specs' comments.
 *
 * Schedule: DEFAULT_RECALL_SCHEDULE (2w 14 d, 6w 42 d, 3m 91 d, 6m 182 d, 12m 365 d).
 * Thresholds: stable ≤ 0.5 mm, relapse > 1.0 mm. asOf 2024-12-31.
 *
 * | case | patient | operator | surgery    | procedure         | phenotype | smoking | complications      | bleeding % | final impression     | pain 2w |
 * |------|---------|----------|------------|-------------------|-----------|---------|--------------------|------------|----------------------|---------|
 * | 11   | 1       | 7        | 2024-01-15 | gingivectomy      | thin      | never   | pain I             | 8          | 2024-03-01 (46 d)    | 8       |
 * | 12   | 1       | 7        | 2024-02-10 | apf-osseous       | thin      | never   | —                  | 12         | 2024-03-15 (34 d)    | 5       |
 * | 21   | 2       | 9        | 2024-02-20 | apf               | thick     | current | infection II, bleeding I | 25   | —                    | 7       |
 * | 31   | 3       | 9        | 2024-03-05 | gingivectomy      | thick     | former  | —                  | —          | 2024-05-01 (57 d)    | 3       |
 * | 41   | 3       | 7        | 2024-06-01 | gingivectomy      | thick     | former  | — (withdrawn)      | 5          | —                    | —       |
 *
 * Visits: case 11 at 2w, 6w (2024-02-26, day 42), 6m (2024-07-15, day 182); case 12 at 2w and
 * 6m (2024-08-10, day 182); case 21 at 2w, 6w (2024-04-02, day 42), 6m (2024-08-20, day 182);
 * case 31 at 2w and 6m (2024-09-03, day 182); case 41 none (withdrawn).
 *
 * Sites (REF→GM in mm; rebound = post-op − recall):
 * | site | case | baseline | post-op | 6w recall (rebound) | 6m recall (rebound) |
 * |------|------|----------|---------|---------------------|---------------------|
 * | 111  | 11   | 8        | 10      | 10.5 (−0.5)         | 9.5 (0.5)           |
 * | 112  | 11   | 7        | 9.5     | 9 (0.5)             | 8 (1.5, relapse)    |
 * | 121  | 12   | 6        | 8       | —                   | 7 (1.0)             |
 * | 211  | 21   | 9        | 11      | 11 (0.0)            | 10 (1.0)            |
 * | 212  | 21   | 8        | 10.5    | 9 (1.5, relapse)    | 8.5 (2.0, relapse)  |
 * | 311  | 31   | 7        | 9       | —                   | 8.5 (0.5)           |
 * Papilla sites (no post-op REF→GM; Jemt score baseline → 6m): 113 (case 11) 3 → 2;
 * 213 (case 21) 2 → 3; 214 (case 21) 2 → 2; 313 (case 31) 3 → 3.
 */
import type { StandardView } from '../shared/schemas/standard';
import type { AuditCaseRecord, AuditDataset } from '../shared/types/audit-dataset';
import type { OutcomeRecord } from '../shared/types/outcome-record';
import { DEFAULT_RECALL_SCHEDULE } from '../shared/types/recall-schedule';

type CaseFields = Pick<AuditCaseRecord, 'caseId' | 'patientId' | 'operatorId' | 'surgeryDate' | 'procedure' | 'phenotype' | 'smoking'>;

/** A case with everything but the fields a test sets left empty. */
export function auditCase(fields: CaseFields & Partial<AuditCaseRecord>): AuditCaseRecord {
  return {
    indication: 'aesthetic',
    diabetes: 'none',
    isWithdrawn: false,
    complications: [],
    visits: [],
    bleedingScorePct: null,
    finalImpressionDate: null,
    painByInterval: {},
    ...fields,
  };
}

/** A site row of one recall visit, copying the case's subgroup fields. */
export function siteRecord(
  owner: AuditCaseRecord,
  fields: Pick<OutcomeRecord, 'siteId' | 'intervalKey' | 'visitDate' | 'baselineRefGm' | 'postOpRefGm' | 'recallRefGm'> & Partial<OutcomeRecord>,
): OutcomeRecord {
  return {
    caseId: owner.caseId,
    patientId: owner.patientId,
    operatorId: owner.operatorId,
    phenotype: owner.phenotype,
    procedure: owner.procedure,
    indication: owner.indication,
    smoking: owner.smoking,
    surgeryDate: owner.surgeryDate,
    tooth: 11,
    location: 'mid-facial',
    baselinePapilla: null,
    recallPapilla: null,
    bleedingOnProbing: false,
    ...fields,
  };
}

const CASE_11 = auditCase({
  caseId: 11, patientId: 1, operatorId: 7, surgeryDate: '2024-01-15', procedure: 'gingivectomy', phenotype: 'thin', smoking: 'never',
  complications: [{ type: 'pain', grade: 'I' }], bleedingScorePct: 8, finalImpressionDate: '2024-03-01', painByInterval: { '2w': 8 },
  visits: [{ intervalKey: '2w', visitDate: '2024-01-29' }, { intervalKey: '6w', visitDate: '2024-02-26' }, { intervalKey: '6m', visitDate: '2024-07-15' }],
});
const CASE_12 = auditCase({
  caseId: 12, patientId: 1, operatorId: 7, surgeryDate: '2024-02-10', procedure: 'apf-osseous-recontouring', phenotype: 'thin', smoking: 'never',
  bleedingScorePct: 12, finalImpressionDate: '2024-03-15', painByInterval: { '2w': 5 },
  visits: [{ intervalKey: '2w', visitDate: '2024-02-24' }, { intervalKey: '6m', visitDate: '2024-08-10' }],
});
const CASE_21 = auditCase({
  caseId: 21, patientId: 2, operatorId: 9, surgeryDate: '2024-02-20', procedure: 'apically-positioned-flap', phenotype: 'thick', smoking: 'current',
  indication: 'restorative-caries', complications: [{ type: 'infection', grade: 'II' }, { type: 'bleeding', grade: 'I' }], bleedingScorePct: 25,
  painByInterval: { '2w': 7 },
  visits: [{ intervalKey: '2w', visitDate: '2024-03-05' }, { intervalKey: '6w', visitDate: '2024-04-02' }, { intervalKey: '6m', visitDate: '2024-08-20' }],
});
const CASE_31 = auditCase({
  caseId: 31, patientId: 3, operatorId: 9, surgeryDate: '2024-03-05', procedure: 'gingivectomy', phenotype: 'thick', smoking: 'former',
  finalImpressionDate: '2024-05-01', painByInterval: { '2w': 3 },
  visits: [{ intervalKey: '2w', visitDate: '2024-03-19' }, { intervalKey: '6m', visitDate: '2024-09-03' }],
});
const CASE_41 = auditCase({
  caseId: 41, patientId: 3, operatorId: 7, surgeryDate: '2024-06-01', procedure: 'gingivectomy', phenotype: 'thick', smoking: 'former',
  isWithdrawn: true, bleedingScorePct: 5,
});

const SITE_ROWS: OutcomeRecord[] = [
  siteRecord(CASE_11, { siteId: 111, intervalKey: '6w', visitDate: '2024-02-26', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 10.5 }),
  siteRecord(CASE_11, { siteId: 112, intervalKey: '6w', visitDate: '2024-02-26', baselineRefGm: 7, postOpRefGm: 9.5, recallRefGm: 9 }),
  siteRecord(CASE_21, { siteId: 211, intervalKey: '6w', visitDate: '2024-04-02', baselineRefGm: 9, postOpRefGm: 11, recallRefGm: 11 }),
  siteRecord(CASE_21, { siteId: 212, intervalKey: '6w', visitDate: '2024-04-02', baselineRefGm: 8, postOpRefGm: 10.5, recallRefGm: 9 }),
  siteRecord(CASE_11, { siteId: 111, intervalKey: '6m', visitDate: '2024-07-15', baselineRefGm: 8, postOpRefGm: 10, recallRefGm: 9.5 }),
  siteRecord(CASE_11, { siteId: 112, intervalKey: '6m', visitDate: '2024-07-15', baselineRefGm: 7, postOpRefGm: 9.5, recallRefGm: 8 }),
  siteRecord(CASE_12, { siteId: 121, intervalKey: '6m', visitDate: '2024-08-10', baselineRefGm: 6, postOpRefGm: 8, recallRefGm: 7 }),
  siteRecord(CASE_21, { siteId: 211, intervalKey: '6m', visitDate: '2024-08-20', baselineRefGm: 9, postOpRefGm: 11, recallRefGm: 10 }),
  siteRecord(CASE_21, { siteId: 212, intervalKey: '6m', visitDate: '2024-08-20', baselineRefGm: 8, postOpRefGm: 10.5, recallRefGm: 8.5 }),
  siteRecord(CASE_31, { siteId: 311, intervalKey: '6m', visitDate: '2024-09-03', baselineRefGm: 7, postOpRefGm: 9, recallRefGm: 8.5 }),
];

const PAPILLA_SCORES: { owner: AuditCaseRecord; siteId: number; baselinePapilla: number; recallPapilla: number }[] = [
  { owner: CASE_11, siteId: 113, baselinePapilla: 3, recallPapilla: 2 },
  { owner: CASE_21, siteId: 213, baselinePapilla: 2, recallPapilla: 3 },
  { owner: CASE_21, siteId: 214, baselinePapilla: 2, recallPapilla: 2 },
  { owner: CASE_31, siteId: 313, baselinePapilla: 3, recallPapilla: 3 },
];

const PAPILLA_ROWS: OutcomeRecord[] = PAPILLA_SCORES.map(({ owner, siteId, baselinePapilla, recallPapilla }) =>
  siteRecord(owner, {
    siteId, intervalKey: '6m', visitDate: owner.visits.find((visit) => visit.intervalKey === '6m')?.visitDate ?? owner.surgeryDate,
    baselineRefGm: 6, postOpRefGm: null, recallRefGm: null, location: 'mesial-papilla', baselinePapilla, recallPapilla,
  }),
);

/** The audit described at the top of this file. */
export const SMALL_AUDIT: AuditDataset = {
  asOf: '2024-12-31',
  schedule: DEFAULT_RECALL_SCHEDULE,
  thresholds: { stable: 0.5, relapse: 1.0 },
  records: [...SITE_ROWS, ...PAPILLA_ROWS],
  cases: [CASE_11, CASE_12, CASE_21, CASE_31, CASE_41],
};

/** A standard with neutral defaults for the fields a test does not set. */
export function auditStandard(fields: Pick<StandardView, 'metric'> & Partial<StandardView>): StandardView {
  return {
    id: 1,
    auditId: 1,
    position: 1,
    criterion: `Criterion on ${fields.metric}`,
    intervalKey: null,
    thresholdMm: null,
    thresholdPct: null,
    minGrade: null,
    comparator: '>=',
    target: 50,
    evidenceSource: '',
    exceptions: '',
    version: 1,
    ...fields,
  };
}

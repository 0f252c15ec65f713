import type { ImportColumn } from '@tidemark/shared';
import { demoEmail } from './test-app';

/** One import row's cells, by template column (shared/schemas/import-row.ts). */
export type ImportCells = Record<ImportColumn, string | number | Date | null>;

/** A valid row: patient IM-0001, a thin never-smoker, case of 10 January 2024 by the demo clinician, tooth 11 at 6 weeks. */
export function importRow(overrides: Partial<ImportCells> = {}): ImportCells {
  return {
    patient_code: 'IM-0001',
    birth_year: 1975,
    sex: 'female',
    smoking: 'never',
    cigarettes_per_day: null,
    diabetes: 'none',
    phenotype: 'thin',
    phenotype_method: 'probe-visibility',
    operator_email: demoEmail('clinician'),
    surgery_date: '2024-01-10',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    instrument: 'scalpel',
    tooth: 11,
    site_location: 'mid-facial',
    reference_point: 'incisal-edge',
    baseline_ref_gm: 8,
    post_op_ref_gm: 10,
    kt_width: 5,
    margin_to_crest: 4,
    baseline_papilla: null,
    interval_key: '6w',
    visit_date: '2024-02-21',
    recall_ref_gm: 9.5,
    recall_papilla: null,
    bleeding_on_probing: 'no',
    pain: 1,
    ...overrides,
  };
}

import * as z from 'zod';
import { CLAVIEN_DINDO_GRADES } from '../types/clinical-terms';
import { STANDARD_METRIC_INFO, STANDARD_METRICS } from '../types/standard-metrics';
import { note } from './clinical-fields';

const standardFields = {
  criterion: z.string().trim().min(3, 'State the criterion.').max(400),
  metric: z.enum(STANDARD_METRICS, { message: 'Choose a measure.' }),
  intervalKey: z.string().trim().max(20).nullable().default(null),
  thresholdMm: z.number().min(0).max(10).nullable().default(null),
  thresholdPct: z.number().min(0).max(100).nullable().default(null),
  minGrade: z.enum(CLAVIEN_DINDO_GRADES).nullable().default(null),
  comparator: z.enum(['>=', '<=']),
  target: z.number().min(-20).max(100),
  evidenceSource: note(1000).default(''),
  exceptions: note(1000).default(''),
};

type StandardShape = { metric: (typeof STANDARD_METRICS)[number]; intervalKey: string | null; thresholdMm: number | null; thresholdPct: number | null; minGrade: string | null };

/** Field errors for parameters a metric needs but lacks. */
export function missingStandardParams(standard: StandardShape): Record<string, string> {
  const info = STANDARD_METRIC_INFO[standard.metric];
  const fields: Record<string, string> = {};
  if (info.needsInterval && !standard.intervalKey) fields['intervalKey'] = 'Choose the recall interval.';
  if (info.needsThresholdMm && standard.thresholdMm === null) fields['thresholdMm'] = 'Give the rebound limit in mm.';
  if (info.needsThresholdPct && standard.thresholdPct === null) fields['thresholdPct'] = 'Give the bleeding-score limit in %.';
  if (info.needsGrade && standard.minGrade === null) fields['minGrade'] = 'Choose the lowest grade counted.';
  return fields;
}

/** `POST /api/audits/:id/standards`. */
export const standardCreateSchema = z.object(standardFields).superRefine((standard, context) => {
  for (const [path, message] of Object.entries(missingStandardParams(standard))) context.addIssue({ code: 'custom', message, path: [path] });
});
export type StandardCreateRequest = z.input<typeof standardCreateSchema>;

/** `PATCH /api/standards/:id`: the whole standard again (parameters depend on each other), with version. */
export const standardUpdateSchema = z
  .object({ ...standardFields, version: z.number().int().min(1) })
  .superRefine((standard, context) => {
    for (const [path, message] of Object.entries(missingStandardParams(standard))) context.addIssue({ code: 'custom', message, path: [path] });
  });
export type StandardUpdateRequest = z.input<typeof standardUpdateSchema>;

/** A standard as the API returns it. */
export interface StandardView {
  id: number;
  auditId: number;
  position: number;
  criterion: string;
  metric: (typeof STANDARD_METRICS)[number];
  intervalKey: string | null;
  thresholdMm: number | null;
  thresholdPct: number | null;
  minGrade: (typeof CLAVIEN_DINDO_GRADES)[number] | null;
  comparator: '>=' | '<=';
  target: number;
  evidenceSource: string;
  exceptions: string;
  version: number;
}

import { CASE_STATUS_LABELS, type CaseStatus } from '@tidemark/shared';

/** Fields stored in millimetres (DESIGN.md §3): their values are always shown with the unit. */
const MILLIMETRE_FIELDS: ReadonlySet<string> = new Set(['refGm', 'baselineRefGm', 'postOpRefGm', 'probingDepth', 'ktWidth', 'marginToCrest', 'plannedExcision', 'deepestProbingMm']);

/** Fields stored as a percentage. */
const PERCENT_FIELDS: ReadonlySet<string> = new Set(['bleedingScorePct', 'plaqueScorePct']);

/** What kind of record a change touched, in our words. */
const RECORD_LABELS: Readonly<Record<string, string>> = {
  case: 'Case',
  patient: 'Patient',
  site: 'Site',
  visit: 'Recall',
  site_measurement: 'Recall reading',
  complication: 'Complication',
  photo: 'Photograph',
};

/** Field names as stored → the trade's words. Unknown fields fall back to spaced-out words. */
const FIELD_LABELS: Readonly<Record<string, string>> = {
  refGm: 'REF→GM',
  baselineRefGm: 'Baseline REF→GM',
  postOpRefGm: 'Post-op REF→GM',
  probingDepth: 'Probing depth',
  bleedingOnProbing: 'Bleeding on probing',
  ktWidth: 'Keratinized tissue width',
  marginToCrest: 'Margin-to-crest',
  papillaScore: 'Papilla score',
  plannedExcision: 'Planned excision',
  referencePoint: 'Reference point',
  visitDate: 'Recall date',
  surgeryDate: 'Surgery date',
  status: 'Status',
  withdrawnReason: 'Reason for withdrawal',
  onsetDate: 'Onset',
  resolutionDate: 'Resolution',
  grade: 'Clavien–Dindo grade',
  deepestProbingMm: 'Deepest probing depth',
  bleedingScorePct: 'Bleeding score',
  plaqueScorePct: 'Plaque score',
  birthYear: 'Birth year',
  cigarettesPerDay: 'Cigarettes a day',
};

/** The kind of record, e.g. "Recall reading". */
export function recordLabel(entity: string): string {
  return RECORD_LABELS[entity] ?? spaced(entity);
}

/** A field name as people read it, e.g. `postOpRefGm` → "Post-op REF→GM". */
export function fieldLabel(field: string): string {
  return FIELD_LABELS[field] ?? spaced(field);
}

/** A stored value as people read it: case states by their label, readings with their unit, nothing as "empty". */
export function valueLabel(field: string, value: string | null): string {
  if (value === null || value === '') {
    return 'empty';
  }
  if (field === 'status' && isCaseStatus(value)) {
    return CASE_STATUS_LABELS[value];
  }
  if (MILLIMETRE_FIELDS.has(field)) {
    return `${value} mm`;
  }
  if (PERCENT_FIELDS.has(field)) {
    return `${value}%`;
  }
  return value;
}

function isCaseStatus(value: string): value is CaseStatus {
  return value in CASE_STATUS_LABELS;
}

/** `camelCase` or `snake_case` → "Camel case". */
function spaced(name: string): string {
  const words = name
    .replace(/_/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLocaleLowerCase();
  return words.charAt(0).toLocaleUpperCase() + words.slice(1);
}

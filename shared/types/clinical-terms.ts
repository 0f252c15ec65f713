/**
 * Controlled vocabularies for clinical records (DESIGN.md §1–§3), with the
 * labels the interface shows. Keys are stored; labels may be reworded freely.
 */

export const SEXES = ['female', 'male', 'unspecified'] as const;
export type Sex = (typeof SEXES)[number];
export const SEX_LABELS: Readonly<Record<Sex, string>> = { female: 'Female', male: 'Male', unspecified: 'Not stated' };

export const SMOKING_STATUSES = ['never', 'former', 'current'] as const;
export const SMOKING_LABELS: Readonly<Record<(typeof SMOKING_STATUSES)[number], string>> = {
  never: 'Never smoked',
  former: 'Former smoker',
  current: 'Current smoker',
};

export const DIABETES_STATUSES = ['none', 'controlled', 'uncontrolled'] as const;
export type DiabetesStatus = (typeof DIABETES_STATUSES)[number];
export const DIABETES_LABELS: Readonly<Record<DiabetesStatus, string>> = {
  none: 'No diabetes',
  controlled: 'Diabetes, controlled',
  uncontrolled: 'Diabetes, uncontrolled',
};

export const PHENOTYPES = ['thin', 'thick'] as const;
export const PHENOTYPE_LABELS: Readonly<Record<(typeof PHENOTYPES)[number], string>> = {
  thin: 'Thin (≤ 1 mm)',
  thick: 'Thick (> 1 mm)',
};

/** How the phenotype was assessed (Jepsen et al. 2018: probe visibility through the margin). */
export const PHENOTYPE_METHODS = ['probe-visibility', 'transgingival-probing', 'visual', 'other'] as const;
export type PhenotypeMethod = (typeof PHENOTYPE_METHODS)[number];
export const PHENOTYPE_METHOD_LABELS: Readonly<Record<PhenotypeMethod, string>> = {
  'probe-visibility': 'Probe visible through the margin',
  'transgingival-probing': 'Transgingival probing',
  visual: 'Visual inspection',
  other: 'Other',
};

export const PROCEDURES = ['gingivectomy', 'apically-positioned-flap', 'apf-osseous-recontouring', 'other'] as const;
export type Procedure = (typeof PROCEDURES)[number];
export const PROCEDURE_LABELS: Readonly<Record<Procedure, string>> = {
  gingivectomy: 'Gingivectomy / gingivoplasty',
  'apically-positioned-flap': 'Apically positioned flap',
  'apf-osseous-recontouring': 'Apically positioned flap with osseous recontouring',
  other: 'Other',
};

export const INDICATIONS = ['aesthetic', 'restorative-caries', 'restorative-fracture', 'restorative-ferrule', 'other'] as const;
export type Indication = (typeof INDICATIONS)[number];
export const INDICATION_LABELS: Readonly<Record<Indication, string>> = {
  aesthetic: 'Excess gingival display / altered passive eruption',
  'restorative-caries': 'Restorative access: caries',
  'restorative-fracture': 'Restorative access: fracture',
  'restorative-ferrule': 'Restorative access: ferrule',
  other: 'Other',
};

export const INSTRUMENTS = ['scalpel', 'electrosurgery', 'laser'] as const;
export type Instrument = (typeof INSTRUMENTS)[number];
export const INSTRUMENT_LABELS: Readonly<Record<Instrument, string>> = { scalpel: 'Scalpel', electrosurgery: 'Electrosurgery', laser: 'Laser' };

/** Case life cycle, our own state names: planned → operated → in recall → concluded, or withdrawn. */
export const CASE_STATUSES = ['planned', 'operated', 'in-recall', 'concluded', 'withdrawn'] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];
export const CASE_STATUS_LABELS: Readonly<Record<CaseStatus, string>> = {
  planned: 'Planned',
  operated: 'Operated',
  'in-recall': 'In recall',
  concluded: 'Concluded',
  withdrawn: 'Withdrawn',
};
/** Allowed forward moves; any state but concluded may move to withdrawn. */
export const CASE_STATUS_NEXT: Readonly<Record<CaseStatus, readonly CaseStatus[]>> = {
  planned: ['operated', 'withdrawn'],
  operated: ['in-recall', 'concluded', 'withdrawn'],
  'in-recall': ['concluded', 'withdrawn'],
  concluded: [],
  withdrawn: [],
};

export const SITE_LOCATIONS = ['mid-facial', 'mesial-papilla', 'distal-papilla'] as const;
export const SITE_LOCATION_LABELS: Readonly<Record<(typeof SITE_LOCATIONS)[number], string>> = {
  'mid-facial': 'Mid-facial',
  'mesial-papilla': 'Mesial papilla',
  'distal-papilla': 'Distal papilla',
};

export const REFERENCE_POINTS = ['incisal-edge', 'cusp-tip', 'restoration-margin', 'stent'] as const;
export type ReferencePoint = (typeof REFERENCE_POINTS)[number];
export const REFERENCE_POINT_LABELS: Readonly<Record<ReferencePoint, string>> = {
  'incisal-edge': 'Incisal edge',
  'cusp-tip': 'Cusp tip',
  'restoration-margin': 'Restoration margin',
  stent: 'Stent notch',
};

export const COMPLICATION_TYPES = [
  'pain',
  'bleeding',
  'infection',
  'delayed-healing',
  'necrosis',
  'recession',
  'hypersensitivity',
  'open-embrasure',
  'other',
] as const;
export type ComplicationType = (typeof COMPLICATION_TYPES)[number];
export const COMPLICATION_TYPE_LABELS: Readonly<Record<ComplicationType, string>> = {
  pain: 'Pain beyond expected',
  bleeding: 'Bleeding',
  infection: 'Infection',
  'delayed-healing': 'Delayed healing',
  necrosis: 'Tissue necrosis',
  recession: 'Recession / over-exposure',
  hypersensitivity: 'Dentine hypersensitivity',
  'open-embrasure': 'Open embrasure',
  other: 'Other',
};

/** Clavien–Dindo grades (Dindo, Demartines & Clavien, Ann Surg 2004;240:205–213), adapted to dental surgery. */
export const CLAVIEN_DINDO_GRADES = ['I', 'II', 'IIIa', 'IIIb', 'IVa', 'IVb', 'V'] as const;
export const CLAVIEN_DINDO_LABELS: Readonly<Record<(typeof CLAVIEN_DINDO_GRADES)[number], string>> = {
  I: 'I — no treatment beyond analgesics, antiemetics, saline rinses',
  II: 'II — other medicines needed (e.g. antibiotics)',
  IIIa: 'IIIa — intervention under local anaesthesia',
  IIIb: 'IIIb — intervention under general anaesthesia',
  IVa: 'IVa — life-threatening, single organ',
  IVb: 'IVb — life-threatening, multi-organ',
  V: 'V — death',
};

export const PHOTO_KINDS = ['pre-operative', 'post-operative', 'recall', 'radiograph'] as const;
export type PhotoKind = (typeof PHOTO_KINDS)[number];
export const PHOTO_KIND_LABELS: Readonly<Record<PhotoKind, string>> = {
  'pre-operative': 'Before surgery',
  'post-operative': 'After surgery',
  recall: 'At recall',
  radiograph: 'Radiograph',
};

/** Jemt papilla index (Jemt 1997, Int J Periodontics Restorative Dent 17:326–333). */
export const PAPILLA_SCORE_LABELS: readonly string[] = [
  '0 — no papilla',
  '1 — less than half the height',
  '2 — half or more, not the full embrasure',
  '3 — fills the embrasure',
  '4 — hyperplastic',
];

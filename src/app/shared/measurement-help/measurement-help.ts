/** The millimetre readings a form asks for, by their form-control name. */
export type MeasuredField =
  | 'baselineRefGm'
  | 'postOpRefGm'
  | 'recallRefGm'
  | 'probingDepth'
  | 'ktWidth'
  | 'marginToCrest'
  | 'plannedExcision'
  | 'papillaScore';

/** One field's help: a few words shown under it, and the whole convention for its tooltip and screen readers. */
export interface MeasurementHelp {
  /** Under the field, where there is room (e.g. "Reference point → margin"). */
  readonly hint: string;
  /** The convention in full (DESIGN.md §3): what is measured, from where, rounding, and what the number means. */
  readonly convention: string;
}

/** Rounding shared by every probe reading (DESIGN.md §3: probes are read to 0.5–1 mm). */
const ROUNDING = 'Millimetres, to the nearest 0.5 mm (0–20 mm).';

/**
 * How each reading is taken, in the words the UI uses (DESIGN.md §3, measurement conventions).
 * REF→GM is always measured from the site's recorded reference point to the mid-facial
 * gingival margin, so readings at different visits can be compared.
 */
export const MEASUREMENT_HELP: Readonly<Record<MeasuredField, MeasurementHelp>> = {
  baselineRefGm: {
    hint: 'Reference point → margin',
    convention: `Before surgery: from the site's fixed reference point (incisal edge, cusp tip, restoration margin or stent notch) to the gingival margin. ${ROUNDING}`,
  },
  postOpRefGm: {
    hint: 'Immediately after surgery',
    convention: `Right after surgery, from the same reference point. Crown gain = post-op − baseline; it grows as tissue is removed. ${ROUNDING}`,
  },
  recallRefGm: {
    hint: 'Same reference point as at baseline',
    convention: `At this recall, from the same reference point to the gingival margin. Rebound = post-op − recall: positive means the margin crept back coronally, negative means it sits further apical than placed (flagged for review). ${ROUNDING}`,
  },
  probingDepth: {
    hint: 'Margin → base of the pocket',
    convention: `From the gingival margin to the base of the sulcus or pocket. ${ROUNDING}`,
  },
  ktWidth: {
    hint: 'Margin → mucogingival junction',
    convention: `Keratinized tissue: from the gingival margin to the mucogingival junction. At least 2 mm should remain after surgery (guidance). ${ROUNDING}`,
  },
  marginToCrest: {
    hint: 'Margin → bone crest, by sounding',
    convention: `Bone sounding: from the gingival margin to the alveolar crest. The new margin should sit about 3 mm from the crest (guidance). ${ROUNDING}`,
  },
  plannedExcision: {
    hint: 'How far the margin moves apically',
    convention: `Tissue to be removed at this site: how far the margin is planned to move apically. ${ROUNDING}`,
  },
  papillaScore: {
    hint: 'Jemt 0–4',
    convention: 'Papilla index after Jemt (1997): 0 no papilla, 1 less than half the height, 2 half or more, 3 fills the embrasure, 4 overgrown.',
  },
};

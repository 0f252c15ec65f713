/**
 * Regions of the mouth from FDI tooth numbers (ISO 3950): quadrant digit 1–2 (5–6 primary)
 * maxillary, 3–4 (7–8) mandibular; tooth digit 1–3 anterior, 4–8 posterior (common practice).
 */
export const REGIONS = ['maxillary-anterior', 'maxillary-posterior', 'mandibular-anterior', 'mandibular-posterior'] as const;
export type Region = (typeof REGIONS)[number];
export const REGION_LABELS: Readonly<Record<Region, string>> = {
  'maxillary-anterior': 'Upper front (canine to canine)',
  'maxillary-posterior': 'Upper back teeth',
  'mandibular-anterior': 'Lower front (canine to canine)',
  'mandibular-posterior': 'Lower back teeth',
};

/** The region of an FDI tooth number. */
export function regionOfTooth(tooth: number): Region {
  const quadrant = Math.floor(tooth / 10);
  const isMaxillary = quadrant === 1 || quadrant === 2 || quadrant === 5 || quadrant === 6;
  const isAnterior = tooth % 10 <= 3;
  return `${isMaxillary ? 'maxillary' : 'mandibular'}-${isAnterior ? 'anterior' : 'posterior'}`;
}

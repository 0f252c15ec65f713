import type { ProportionEstimate } from '@tidemark/shared';

/** Shown where a figure cannot be computed. */
export const NOT_AVAILABLE = '—';

/** A number with a true minus sign (U+2212), as printed statistics use. */
export function formatNumber(value: number, digits: number): string {
  const text = value.toFixed(digits);
  // −0.00 would read as a direction that is not there.
  if (Number(text) === 0) return (0).toFixed(digits);
  return text.startsWith('-') ? `−${text.slice(1)}` : text;
}

/** Millimetres to two decimals ("0.77 mm"): means of 0.5 mm readings carry that precision. */
export function formatMm(value: number | null | undefined, digits = 2): string {
  return value === null || value === undefined || !Number.isFinite(value) ? NOT_AVAILABLE : `${formatNumber(value, digits)} mm`;
}

/** A share as a percentage with one decimal ("49.9%"). */
export function formatShare(share: number | null | undefined): string {
  return share === null || share === undefined || !Number.isFinite(share) ? NOT_AVAILABLE : `${formatNumber(share * 100, 1)}%`;
}

/** A 95% interval, "a to b" (a dash would be confused with a minus sign). */
export function formatInterval(lower: number, upper: number, format: (value: number) => string): string {
  return `${format(lower)} to ${format(upper)}`;
}

/** A proportion with its Wilson interval: "49.9% (44.6 to 55.1%)". */
export function formatProportion(estimate: ProportionEstimate): string {
  if (estimate.p === null) return NOT_AVAILABLE;
  const share = formatShare(estimate.p);
  if (estimate.lower === null || estimate.upper === null) return share;
  return `${share} (${formatInterval(estimate.lower, estimate.upper, (value) => formatNumber(value * 100, 1))}%)`;
}

/** "1 site" / "584 sites". */
export function countOf(count: number, singular: string, plural = `${singular}s`): string {
  return `${count} ${count === 1 ? singular : plural}`;
}

/** The caption's counts line: "339 sites · 50 patients · 93 cases"; missing counts are left out. */
export function countsLine(counts: { readonly sites?: number; readonly patients?: number; readonly cases?: number }): string {
  const parts: string[] = [];
  if (counts.sites !== undefined) parts.push(countOf(counts.sites, 'site'));
  if (counts.patients !== undefined) parts.push(countOf(counts.patients, 'patient'));
  if (counts.cases !== undefined) parts.push(countOf(counts.cases, 'case'));
  return parts.join(' · ');
}

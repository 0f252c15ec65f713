const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2025-06" → "Jun 2025"; anything else is shown as it came. */
export function monthLabel(month: string): string {
  const match = /^(\d{4})-(\d{2})/.exec(month);
  const index = match ? Number(match[2]) - 1 : -1;
  return match && index >= 0 && index < 12 ? `${MONTHS[index]} ${match[1]}` : month;
}

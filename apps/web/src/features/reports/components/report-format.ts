/** Hours as the reports show them: one decimal, and days beside anything past two days. */
export function formatHours(hours: number | null): string {
  if (hours === null) return '—';
  const text = `${hours.toFixed(1)} h`;
  return hours >= 48 ? `${text} (${(hours / 24).toFixed(1)} d)` : text;
}

/** A share 0…1 as a percentage with one decimal. */
export const formatShare = (share: number): string => `${(share * 100).toFixed(1)} %`;

/** A week's Monday as a short date (the key stays YYYY-MM-DD in the table and CSV). */
export const formatWeek = (monday: string): string =>
  new Date(`${monday}T00:00:00Z`).toLocaleDateString(undefined, { day: 'numeric', month: 'short', timeZone: 'UTC' });

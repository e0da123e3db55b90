const dateFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });
const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Formats an ISO timestamp for tables; an empty or unreadable value shows as an em dash. */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const time = Date.parse(iso);
  return Number.isNaN(time) ? '—' : dateFormat.format(time);
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const time = Date.parse(iso);
  return Number.isNaN(time) ? '—' : dateTimeFormat.format(time);
}

/**
 * A signed number for deltas such as fuel trims: "+1.5", "−0.3", and "0.0" for anything that rounds to zero,
 * so a tiny negative never prints as "-0.0". The minus is U+2212, the typographic minus sign.
 */
export function formatSigned(value: number, digits = 1): string {
  if (!Number.isFinite(value)) return '—';
  const text = Math.abs(value).toFixed(digits);
  if (Number(text) === 0) return text;
  return `${value > 0 ? '+' : '−'}${text}`;
}

/** How a value of each canonical unit is written: decimals a tuner reads at, and whether a space precedes the symbol. */
interface UnitStyle {
  decimals: number;
  /** SI writes a space between number and unit, except for the plane-angle degree (BIPM SI Brochure, 9th ed., 5.4.3). */
  spaced: boolean;
  /** λ is a ratio, written before the number as tuners say it ("λ 0.82"). */
  prefix?: boolean;
}

const UNIT_STYLES: Readonly<Record<string, UnitStyle>> = {
  rpm: { decimals: 0, spaced: true },
  'km/h': { decimals: 0, spaced: true },
  '°C': { decimals: 0, spaced: true },
  kPa: { decimals: 1, spaced: true },
  '%': { decimals: 1, spaced: true },
  'g/s': { decimals: 1, spaced: true },
  '°': { decimals: 1, spaced: false },
  λ: { decimals: 3, spaced: true, prefix: true },
  s: { decimals: 1, spaced: true },
  '': { decimals: 0, spaced: false },
};
const FALLBACK: UnitStyle = { decimals: 2, spaced: true };

const styleOf = (unit: string) => UNIT_STYLES[unit] ?? FALLBACK;

/** The number alone, at the unit's precision, with a true minus sign and never "−0". */
export function formatNumber(value: number, unit: string): string {
  if (!Number.isFinite(value)) return '—';
  const text = value.toFixed(styleOf(unit).decimals);
  if (/^-0(?:\.0+)?$/.test(text)) return text.slice(1);
  return text.replace('-', '−');
}

/** "6432 rpm", "92 °C", "4.5°", "λ 0.823", "3" (gear); a blank value is an em dash. */
export function formatValue(value: number | null | undefined, unit: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const style = styleOf(unit);
  const number = formatNumber(value, unit);
  if (unit === '') return number;
  if (style.prefix) return `${unit} ${number}`;
  return style.spaced ? `${number} ${unit}` : `${number}${unit}`;
}

/** A difference with its sign: "+120 rpm", "−1.5°"; λ, a plain ratio, reads "+0.020". */
export function formatChange(delta: number | null, unit: string): string {
  if (delta === null || !Number.isFinite(delta)) return '—';
  const magnitude = formatNumber(Math.abs(delta), unit);
  const sign = /^[0.]+$/.test(magnitude) ? '±' : delta > 0 ? '+' : '−';
  if (styleOf(unit).prefix) return `${sign}${magnitude}`;
  return `${sign}${formatValue(Math.abs(delta), unit)}`;
}

/** "engine speed (rpm)"; a label that already ends in brackets takes the unit after a comma; gear has none. */
export function withUnit(label: string, unit: string): string {
  if (unit === '') return label;
  return label.endsWith(')') ? `${label}, ${unit}` : `${label} (${unit})`;
}

/** The y-axis title of a unit group; gear has no unit, so its axis is named for the channel. */
export const axisLabel = (unit: string) => (unit === '' ? 'gear' : unit);

export interface UnitGroup<C> {
  unit: string;
  /** Stable recharts axis id for the unit. */
  axisId: string;
  channels: C[];
}

/** Channels sharing a unit share one y-axis, in the order the units first appear. */
export function groupByUnit<C extends { unit: string }>(channels: readonly C[]): UnitGroup<C>[] {
  const groups = new Map<string, UnitGroup<C>>();
  for (const channel of channels) {
    const group = groups.get(channel.unit) ?? { unit: channel.unit, axisId: `unit:${channel.unit || 'count'}`, channels: [] };
    group.channels.push(channel);
    groups.set(channel.unit, group);
  }
  return [...groups.values()];
}

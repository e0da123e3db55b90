import type { UnitSystem } from '@revloop/contract';
import { kmhToMph } from '@revloop/domain/vehicles';

/** 1 in = 25.4 mm and 1 lb = 0.45359237 kg exactly (international yard and pound agreement, 1959). */
const MM_PER_INCH = 25.4;
const KG_PER_LB = 0.45359237;

const fixed = (value: number, digits: number) =>
  value.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });

/** Road speed in the user's units: "126.4 km/h" or "78.5 mph". */
export function formatSpeed(kmh: number, units: UnitSystem, digits = 1): string {
  return units === 'imperial' ? `${fixed(kmhToMph(kmh), digits)} mph` : `${fixed(kmh, digits)} km/h`;
}

/** A tyre dimension: "704.0 mm" or "27.72 in". */
export function formatLength(mm: number, units: UnitSystem): string {
  return units === 'imperial' ? `${fixed(mm / MM_PER_INCH, 2)} in` : `${fixed(mm, 1)} mm`;
}

export function formatMass(kg: number, units: UnitSystem): string {
  return units === 'imperial' ? `${fixed(kg / KG_PER_LB, 0)} lb` : `${fixed(kg, 0)} kg`;
}

/** How far a measured rolling circumference sits from the tyre size's: "2.8 % shorter than". */
export function circumferenceDeviation(measuredMm: number, sizeMm: number): string {
  const pct = (measuredMm / sizeMm - 1) * 100;
  if (Math.abs(pct) < 0.05) return 'the same as';
  return `${fixed(Math.abs(pct), 1)} % ${pct < 0 ? 'shorter' : 'longer'} than`;
}

export const speedUnit = (units: UnitSystem) => (units === 'imperial' ? 'mph' : 'km/h');

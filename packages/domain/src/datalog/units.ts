import type { Quantity } from './channels';

/** canonical = source · scale + offset; every unit a logger writes converts affinely to the canonical one. */
export interface UnitConversion {
  /** Source unit as the analysis understood it, e.g. "°F", "psi (gauge)". */
  unit: string;
  scale: number;
  offset: number;
  /** Gauge pressure: the offset is one standard atmosphere, replaced by the logged barometric pressure where there is one. */
  gauge?: boolean;
}

/** Standard atmosphere, added to gauge ("boost") pressure to make it absolute (ISO 2533). */
export const STANDARD_ATMOSPHERE_KPA = 101.325;

// Exact definitions: 1 mile = 1609.344 m and 1 lb = 0.45359237 kg (1959 yard and pound agreement),
// 1 psi = 1 lbf/in² = 6.894757293168361 kPa, 1 inHg (0 °C) = 3.38638815789 kPa, °F → °C = (F − 32)·5/9 (NIST SP 811).
const KMH_PER_MPH = 1.609344;
const G_PER_LB = 453.59237;
const KPA_PER_PSI = 6.894757293168361;
const KPA_PER_INHG = 3.38638815789;

interface UnitEntry {
  label: string;
  scale: number;
  offset: number;
}

const entry = (label: string, scale = 1, offset = 0): UnitEntry => ({ label, scale, offset });

// Keys are unit texts after normaliseUnitText (lowercase, no spaces, "°"/"º"/"degrees" → "deg").
const UNITS: Readonly<
  Record<Exclude<Quantity, 'lambda' | 'count'>, Readonly<Record<string, UnitEntry>>>
> = {
  time: {
    s: entry('s'),
    sec: entry('s'),
    secs: entry('s'),
    second: entry('s'),
    seconds: entry('s'),
    ms: entry('ms', 0.001),
    msec: entry('ms', 0.001),
    millisecond: entry('ms', 0.001),
    milliseconds: entry('ms', 0.001),
    min: entry('min', 60),
  },
  rotational_speed: {
    rpm: entry('rpm'),
    '1/min': entry('rpm'),
    'r/min': entry('rpm'),
    'rev/min': entry('rpm'),
    'min-1': entry('rpm'),
    // "rpm.min" and "engine_speed_min": revolutions per minute, the minute named alone.
    min: entry('rpm'),
  },
  speed: {
    'km/h': entry('km/h'),
    kmh: entry('km/h'),
    kph: entry('km/h'),
    'km/hr': entry('km/h'),
    mph: entry('mph', KMH_PER_MPH),
    'mi/h': entry('mph', KMH_PER_MPH),
    'm/s': entry('m/s', 3.6),
  },
  temperature: {
    degc: entry('°C'),
    c: entry('°C'),
    celsius: entry('°C'),
    degf: entry('°F', 5 / 9, -160 / 9),
    f: entry('°F', 5 / 9, -160 / 9),
    fahrenheit: entry('°F', 5 / 9, -160 / 9),
    k: entry('K', 1, -273.15),
    kelvin: entry('K', 1, -273.15),
  },
  pressure: {
    kpa: entry('kPa'),
    kpaa: entry('kPa'),
    psi: entry('psi', KPA_PER_PSI),
    psia: entry('psi', KPA_PER_PSI),
    bar: entry('bar', 100),
    mbar: entry('mbar', 0.1),
    hpa: entry('hPa', 0.1),
    inhg: entry('inHg', KPA_PER_INHG),
  },
  mass_flow: {
    'g/s': entry('g/s'),
    gs: entry('g/s'),
    'g/sec': entry('g/s'),
    gps: entry('g/s'),
    'lb/min': entry('lb/min', G_PER_LB / 60),
    'lbs/min': entry('lb/min', G_PER_LB / 60),
    'lbm/min': entry('lb/min', G_PER_LB / 60),
    lbmin: entry('lb/min', G_PER_LB / 60),
    lbsmin: entry('lb/min', G_PER_LB / 60),
    kgh: entry('kg/h', 1 / 3.6),
    lbh: entry('lb/h', G_PER_LB / 3600),
    'kg/h': entry('kg/h', 1 / 3.6),
    'kg/hr': entry('kg/h', 1 / 3.6),
    'lb/h': entry('lb/h', G_PER_LB / 3600),
    'lb/hr': entry('lb/h', G_PER_LB / 3600),
  },
  percent: { '%': entry('%'), pct: entry('%'), percent: entry('%') },
  angle: {
    deg: entry('°'),
    degbtdc: entry('°'),
    degca: entry('°'),
    btdc: entry('°'),
    degcrank: entry('°'),
  },
};

const LAMBDA_UNITS = new Set(['λ', 'lambda', 'lam', 'eq', 'er']);
const AFR_UNITS = new Set(['afr', 'a/f', 'air/fuel', 'af']);
const GAUGE_SUFFIXES = [
  'psig',
  'barg',
  'kpag',
  'kpa(g)',
  'psi(g)',
  'bar(g)',
  'kpagauge',
  'psigauge',
  'bargauge',
];

export function normaliseUnitText(text: string): string {
  return text
    .trim()
    .toLowerCase()
    .replace(/degrees?/g, 'deg')
    .replace(/[°º]/g, 'deg')
    .replace(/\s+/g, '');
}

/** Every unit text the importer knows, so a trailing word like "psi" in "Boost psi" can be read as a unit. */
export function isKnownUnitText(text: string): boolean {
  const key = normaliseUnitText(text);
  if (LAMBDA_UNITS.has(key) || AFR_UNITS.has(key) || GAUGE_SUFFIXES.includes(key)) return true;
  return Object.values(UNITS).some((table) => key in table);
}

export type LambdaUnit = 'lambda' | 'afr';

/** Reads "AFR" / "λ" from a unit text; null when the text does not say. */
export function lambdaUnitOf(text: string | null): LambdaUnit | null {
  if (text === null) return null;
  const key = normaliseUnitText(text);
  if (AFR_UNITS.has(key)) return 'afr';
  if (LAMBDA_UNITS.has(key)) return 'lambda';
  return null;
}

export function lambdaConversion(unit: LambdaUnit, stoichAfr: number): UnitConversion {
  return unit === 'afr'
    ? { unit: `AFR (stoich ${stoichAfr.toFixed(2)})`, scale: 1 / stoichAfr, offset: 0 }
    : { unit: 'λ', scale: 1, offset: 0 };
}

/**
 * Conversion for a non-lambda quantity from a header's unit text, or null when the text is no unit of that
 * quantity. Gauge pressure (a "boost" column, psig, barg…) gets one standard atmosphere added.
 */
export function unitConversion(
  quantity: Exclude<Quantity, 'lambda'>,
  unitText: string,
  gauge: boolean,
): UnitConversion | null {
  if (quantity === 'count') return { unit: '', scale: 1, offset: 0 };
  let key = normaliseUnitText(unitText);
  let isGauge = gauge;
  if (quantity === 'pressure') {
    if (GAUGE_SUFFIXES.includes(key)) {
      isGauge = true;
      key = key.replace(/\(g\)$|gauge$|g$/, '');
    } else if (key.endsWith('abs') || key === 'psia' || key === 'kpaa') {
      isGauge = false;
      key = key.replace(/abs$/, '');
    }
  }
  const found = UNITS[quantity][key];
  if (found === undefined) return null;
  if (quantity === 'pressure' && isGauge) {
    return {
      unit: `${found.label} (gauge)`,
      scale: found.scale,
      offset: STANDARD_ATMOSPHERE_KPA,
      gauge: true,
    };
  }
  return { unit: found.label, scale: found.scale, offset: found.offset };
}

/** Units a user may state for a channel (CLI `--unit`, the mapping dialog's picker); values are unit texts the importer reads. */
export const UNIT_CHOICES: Readonly<Record<Quantity, readonly { value: string; label: string }[]>> = {
  time: [
    { value: 's', label: 's' },
    { value: 'ms', label: 'ms' },
    { value: 'min', label: 'min' },
  ],
  rotational_speed: [{ value: 'rpm', label: 'rpm' }],
  speed: [
    { value: 'km/h', label: 'km/h' },
    { value: 'mph', label: 'mph' },
    { value: 'm/s', label: 'm/s' },
  ],
  temperature: [
    { value: '°C', label: '°C' },
    { value: '°F', label: '°F' },
    { value: 'K', label: 'K' },
  ],
  pressure: [
    // "abs" is said outright, so a stated absolute unit overrules a header that reads as boost.
    { value: 'kPa abs', label: 'kPa absolute' },
    { value: 'kPag', label: 'kPa gauge' },
    { value: 'psia', label: 'psi absolute' },
    { value: 'psig', label: 'psi gauge' },
    { value: 'bar abs', label: 'bar absolute' },
    { value: 'barg', label: 'bar gauge' },
    { value: 'inHg abs', label: 'inHg absolute' },
    { value: 'hPa abs', label: 'hPa absolute' },
  ],
  mass_flow: [
    { value: 'g/s', label: 'g/s' },
    { value: 'lb/min', label: 'lb/min' },
    { value: 'kg/h', label: 'kg/h' },
    { value: 'lb/h', label: 'lb/h' },
  ],
  percent: [{ value: '%', label: '%' }],
  lambda: [
    { value: 'lambda', label: 'λ' },
    { value: 'afr', label: 'AFR' },
  ],
  angle: [{ value: '°', label: '°' }],
  count: [],
};

/** Whether a unit text is one of the quantity's (so a stated unit can be refused before anything is read). */
export function isUnitOf(quantity: Quantity, text: string): boolean {
  if (quantity === 'lambda') return lambdaUnitOf(text) !== null;
  if (quantity === 'count') return false;
  return unitConversion(quantity, text, false) !== null;
}

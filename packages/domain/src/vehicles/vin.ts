/**
 * VIN checks. ISO 3779 fixes the shape everywhere (17 characters, no I, O or Q); 49 CFR 565 adds a check digit at
 * position 9 and a model-year code at position 10, rules that bind only VINs from North America.
 */

export type VinRegion =
  'north_america' | 'africa' | 'asia' | 'europe' | 'oceania' | 'south_america' | 'unassigned';

export const VIN_REGION_LABELS: Record<VinRegion, string> = {
  north_america: 'North America',
  africa: 'Africa',
  asia: 'Asia',
  europe: 'Europe',
  oceania: 'Oceania',
  south_america: 'South America',
  unassigned: 'an unassigned region',
};

export interface VinCheck {
  /** Upper-cased, whitespace removed. */
  vin: string;
  /** Region of the world manufacturer identifier, from its first character; null until there is one. */
  region: VinRegion | null;
  /** Whether the 49 CFR 565 check digit and model-year rules bind this VIN (North American WMI). */
  northAmerican: boolean;
  wellFormed: boolean;
  checkDigitOk: boolean;
  expectedCheckDigit: string | null;
  /** Decoded from position 10 for North American VINs only; null means "ask the user". */
  modelYear: number | null;
  /** Problems that make the VIN unusable. */
  errors: string[];
  /** Problems a user may override, e.g. a wrong check digit, or notes such as "enter the model year". */
  warnings: string[];
}

export const VIN_LENGTH = 17;

export const NOT_ENCODED_WARNING =
  'Check digit and model year are not encoded in VINs from this region; enter the model year.';

// 49 CFR 565.15(c) Table III: letters to numeric values, written as the table prints them; digits stand for themselves.
const TRANSLITERATION: ReadonlyMap<string, number> = new Map(
  'A1 B2 C3 D4 E5 F6 G7 H8 J1 K2 L3 M4 N5 P7 R9 S2 T3 U4 V5 W6 X7 Y8 Z9'
    .split(' ')
    .map((pair) => [pair.charAt(0), Number(pair.charAt(1))]),
);

// 49 CFR 565.15(c) Table IV: position weights; position 9 (the check digit itself) weighs 0.
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2] as const;

// 49 CFR 565.15(d): year codes in order from 1980 (and again from 2010), repeating every 30 years.
const YEAR_CODES = 'ABCDEFGHJKLMNPRSTVWXY123456789';

// ISO 3780 regions by the first character of the world manufacturer identifier.
const REGIONS: readonly [RegExp, VinRegion][] = [
  [/[1-5]/, 'north_america'],
  [/[A-H]/, 'africa'],
  [/[J-R]/, 'asia'],
  [/[S-Z]/, 'europe'],
  [/[67]/, 'oceania'],
  [/[89]/, 'south_america'],
];

const CHECK_DIGIT_POSITION = 9;
const YEAR_POSITION = 10;
const YEAR_CYCLE_POSITION = 7;

function transliterate(char: string): number | undefined {
  if (/^[0-9]$/.test(char)) return Number(char);
  return TRANSLITERATION.get(char);
}

/** The ISO 3780 region of a VIN's world manufacturer identifier, or null for an empty VIN. */
export function vinRegion(vin: string): VinRegion | null {
  const first = vin.trim().charAt(0).toUpperCase();
  if (first === '') return null;
  return REGIONS.find(([pattern]) => pattern.test(first))?.[1] ?? 'unassigned';
}

/** The check digit for a 17-character VIN (position 9 is ignored), or null when a character has no value. */
export function vinCheckDigit(vin: string): string | null {
  if (vin.length !== VIN_LENGTH) return null;
  let sum = 0;
  for (let i = 0; i < VIN_LENGTH; i += 1) {
    const value = transliterate(vin.charAt(i));
    if (value === undefined) return null;
    sum += value * (WEIGHTS[i] ?? 0);
  }
  const remainder = sum % 11;
  return remainder === 10 ? 'X' : String(remainder);
}

/**
 * Model year from position 10 under 49 CFR 565. Position 7 numeric → 1980–2009 cycle, letter → 2010–2039; that
 * rule is defined for passenger cars, MPVs and light trucks, the vehicles a tuning shop sees.
 */
export function vinModelYear(vin: string): number | null {
  const index = YEAR_CODES.indexOf(vin.charAt(YEAR_POSITION - 1));
  const cycleChar = vin.charAt(YEAR_CYCLE_POSITION - 1);
  if (index < 0 || cycleChar === '') return null;
  return (/[0-9]/.test(cycleChar) ? 1980 : 2010) + index;
}

export function checkVin(input: string): VinCheck {
  const vin = input.replace(/\s+/g, '').toUpperCase();
  const region = vinRegion(vin);
  const northAmerican = region === 'north_america';
  const errors: string[] = [];
  const warnings: string[] = [];

  if (vin.length !== VIN_LENGTH)
    errors.push(`A VIN has ${VIN_LENGTH} characters; this one has ${vin.length}.`);
  const forbidden = [...new Set(vin.match(/[IOQ]/g) ?? [])];
  if (forbidden.length > 0)
    errors.push(`A VIN never contains ${forbidden.join(', ')} (they look like 1 and 0).`);
  const unknown = [...new Set(vin.match(/[^A-Z0-9]/g) ?? [])];
  if (unknown.length > 0)
    errors.push(
      `A VIN holds only letters and digits; found ${unknown.map((c) => `"${c}"`).join(', ')}.`,
    );

  const checkChar = vin.charAt(CHECK_DIGIT_POSITION - 1);
  const complete = vin.length === VIN_LENGTH;
  if (northAmerican && complete && !/^[0-9X]$/.test(checkChar)) {
    errors.push(
      `Position ${CHECK_DIGIT_POSITION} is the check digit and must be 0–9 or X, not "${checkChar}".`,
    );
  }
  const modelYear = northAmerican && complete ? vinModelYear(vin) : null;
  if (northAmerican && complete && modelYear === null) {
    errors.push(
      `Position ${YEAR_POSITION} ("${vin.charAt(YEAR_POSITION - 1)}") is not a model-year code.`,
    );
  }

  const wellFormed = errors.length === 0;
  const expectedCheckDigit = wellFormed ? vinCheckDigit(vin) : null;
  const checkDigitOk = expectedCheckDigit !== null && expectedCheckDigit === checkChar;
  if (wellFormed && !northAmerican) {
    warnings.push(NOT_ENCODED_WARNING);
  } else if (wellFormed && !checkDigitOk) {
    warnings.push(
      `Check digit is "${checkChar}" but the other characters give "${expectedCheckDigit}": check for a typo. ` +
        'Vehicles built for markets outside North America may not use the check digit.',
    );
  }
  return {
    vin,
    region,
    northAmerican,
    wellFormed,
    checkDigitOk,
    expectedCheckDigit,
    modelYear,
    errors,
    warnings,
  };
}

/** Whether the user must confirm the VIN before it is kept: a North American VIN whose check digit does not match. */
export const vinNeedsConfirmation = (check: VinCheck): boolean =>
  check.northAmerican && check.wellFormed && !check.checkDigitOk;

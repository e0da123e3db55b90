import { DomainError } from '../errors';

export interface TyreSize {
  /** Normalised designation, e.g. "245/40R20" or "215/65R16C"; the service description is dropped. */
  code: string;
  widthMm: number;
  aspectRatio: number;
  rimIn: number;
  /** "C" after the rim: a commercial (van) tyre; same dimensions, stronger construction. */
  commercial: boolean;
  sidewallMm: number;
  diameterMm: number;
  /** Unloaded: π × the designation's diameter. */
  circumferenceMm: number;
}

const MM_PER_INCH = 25.4;

// ISO 4000-1 / ETRTO metric designation: optional service prefix (P, LT, T), width/aspect, construction
// (R, ZR, RF, D, B or "-"), rim diameter, optional "C" (commercial); then, in any order, a service description
// (load index or "109/107" pair plus speed symbol, bare or in brackets) and a reinforced marking (XL, RF, RFT).
const TYRE_PATTERN =
  /^(?:P|LT|T)?\s*(\d{3})\s*\/\s*(\d{2,3})\s*(?:ZR|RF|R|D|B|-)?\s*(\d{2}(?:\.\d)?)(\s?C)?((?:\s+(?:\(\d{2,3}(?:\/\d{2,3})?\s?[A-Z]\d?\)|\d{2,3}(?:\/\d{2,3})?\s?[A-Z]\d?|XL|RF|RFT))*)$/i;

const WIDTH_RANGE_MM = [105, 455] as const;
const ASPECT_RANGE = [20, 95] as const;
const RIM_RANGE_IN = [10, 30] as const;

function outOfRange(value: number, [lo, hi]: readonly [number, number]): boolean {
  return value < lo || value > hi;
}

/** Parses "245/40R20", "P245/40ZR20 95Y", "225/45R17 (94W) XL" or "215/65R16C 109/107T" and derives the geometry. */
export function parseTyreSize(code: string): TyreSize {
  const match = TYRE_PATTERN.exec(code.trim().replace(/\s+/g, ' '));
  const [, width, aspect, rim, commercialMark] = match ?? [];
  if (width === undefined || aspect === undefined || rim === undefined) {
    throw new DomainError('validation', `"${code}" is not a metric tyre size such as 245/40R20.`);
  }
  const widthMm = Number(width);
  const aspectRatio = Number(aspect);
  const rimIn = Number(rim);
  if (
    outOfRange(widthMm, WIDTH_RANGE_MM) ||
    outOfRange(aspectRatio, ASPECT_RANGE) ||
    outOfRange(rimIn, RIM_RANGE_IN)
  ) {
    throw new DomainError(
      'validation',
      `Tyre size "${code}" is out of range: width ${WIDTH_RANGE_MM.join('–')} mm, aspect ${ASPECT_RANGE.join('–')}, rim ${RIM_RANGE_IN.join('–')} in.`,
    );
  }
  const sidewallMm = (widthMm * aspectRatio) / 100;
  const diameterMm = rimIn * MM_PER_INCH + 2 * sidewallMm;
  const commercial = commercialMark !== undefined;
  return {
    code: `${widthMm}/${aspectRatio}R${rim}${commercial ? 'C' : ''}`,
    widthMm,
    aspectRatio,
    rimIn,
    commercial,
    sidewallMm,
    diameterMm,
    circumferenceMm: Math.PI * diameterMm,
  };
}

export type CircumferenceSource = 'measured' | 'tyre_size';

export interface RollingCircumference {
  circumferenceMm: number;
  source: CircumferenceSource;
}

/**
 * The circumference that turns wheel speed into road speed: the user's measured rolling circumference when given
 * (a loaded tyre rolls a few percent short of its unloaded size), else the one computed from the tyre size.
 */
export function rollingCircumference(vehicle: {
  tyreSize: string;
  rollingCircumferenceMm?: number | null | undefined;
}): RollingCircumference {
  const measured = vehicle.rollingCircumferenceMm;
  if (measured !== null && measured !== undefined) {
    if (!Number.isFinite(measured) || measured <= 0) {
      throw new DomainError(
        'validation',
        `A measured rolling circumference must be a positive number, got ${measured}.`,
      );
    }
    return { circumferenceMm: measured, source: 'measured' };
  }
  return { circumferenceMm: parseTyreSize(vehicle.tyreSize).circumferenceMm, source: 'tyre_size' };
}

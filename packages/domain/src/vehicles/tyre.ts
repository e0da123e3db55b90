import { DomainError } from '../errors';

export interface TyreSize {
  /** Normalised designation, e.g. "245/40R20". */
  code: string;
  widthMm: number;
  aspectRatio: number;
  rimIn: number;
  sidewallMm: number;
  diameterMm: number;
  circumferenceMm: number;
}

const MM_PER_INCH = 25.4;

// ISO 4000-1 / ETRTO metric designation: optional service prefix (P, LT, T), width/aspect, construction
// (R, ZR, RF, D, B or "-"), rim diameter, then an optional service description ("95Y", "XL").
const TYRE_PATTERN =
  /^(?:P|LT|T)?\s*(\d{3})\s*\/\s*(\d{2,3})\s*(?:ZR|RF|R|D|B|-)?\s*(\d{2}(?:\.\d)?)(?:\s+\d{2,3}(?:\/\d{2,3})?\s?[A-Z]{1,2})?(?:\s+(?:XL|RF|RFT))?$/i;

const WIDTH_RANGE_MM = [105, 455] as const;
const ASPECT_RANGE = [20, 95] as const;
const RIM_RANGE_IN = [10, 30] as const;

function outOfRange(value: number, [lo, hi]: readonly [number, number]): boolean {
  return value < lo || value > hi;
}

/** Parses "245/40R20", "245/40 R20" or "P245/40ZR20 95Y" and derives the rolling geometry. */
export function parseTyreSize(code: string): TyreSize {
  const match = TYRE_PATTERN.exec(code.trim().replace(/\s+/g, ' '));
  const [, width, aspect, rim] = match ?? [];
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
  return {
    code: `${widthMm}/${aspectRatio}R${rim}`,
    widthMm,
    aspectRatio,
    rimIn,
    sidewallMm,
    diameterMm,
    circumferenceMm: Math.PI * diameterMm,
  };
}

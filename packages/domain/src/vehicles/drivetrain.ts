import { DomainError } from '../errors';

/** Below this road speed the gear cannot be told from rpm: the clutch may be slipping or the car rolling. */
export const MIN_GEAR_DETECT_SPEED_KMH = 5;
/** Default relative mismatch allowed between the observed overall ratio and a gear's. */
export const DEFAULT_GEAR_TOLERANCE = 0.05;

const KM_PER_MILE = 1.609344;

function assertPositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new DomainError('validation', `${name} must be a positive number, got ${value}.`);
  }
}

function assertGearing(gearRatio: number, finalDrive: number, tyreCircumferenceMm: number): void {
  assertPositive('Gear ratio', gearRatio);
  assertPositive('Final drive ratio', finalDrive);
  assertPositive('Tyre circumference', tyreCircumferenceMm);
}

/** km/h = rpm · C[m] · 60 / (1000 · gear · final): wheel turns per minute times the rolling circumference. */
export function roadSpeedKmh(
  rpm: number,
  gearRatio: number,
  finalDrive: number,
  tyreCircumferenceMm: number,
): number {
  assertGearing(gearRatio, finalDrive, tyreCircumferenceMm);
  return (rpm * (tyreCircumferenceMm / 1000) * 60) / (1000 * gearRatio * finalDrive);
}

export function engineRpmAt(
  speedKmh: number,
  gearRatio: number,
  finalDrive: number,
  tyreCircumferenceMm: number,
): number {
  assertGearing(gearRatio, finalDrive, tyreCircumferenceMm);
  return (speedKmh * 1000 * gearRatio * finalDrive) / ((tyreCircumferenceMm / 1000) * 60);
}

/** 1-based gear whose ratio best explains rpm/speed, or null (speed too low, clutch slip, no match within tolerance). */
export function gearFromRpmAndSpeed(
  rpm: number,
  speedKmh: number,
  gearRatios: readonly number[],
  finalDrive: number,
  tyreCircumferenceMm: number,
  tolerance: number = DEFAULT_GEAR_TOLERANCE,
): number | null {
  if (gearRatios.length === 0)
    throw new DomainError('validation', 'At least one gear ratio is needed to detect the gear.');
  const badGear = gearRatios.findIndex((ratio) => !(Number.isFinite(ratio) && ratio > 0));
  if (badGear >= 0) assertPositive(`Gear ${badGear + 1} ratio`, gearRatios[badGear] ?? Number.NaN);
  assertGearing(1, finalDrive, tyreCircumferenceMm);
  assertPositive('Gear tolerance', tolerance);
  if (
    !Number.isFinite(rpm) ||
    !Number.isFinite(speedKmh) ||
    rpm <= 0 ||
    speedKmh < MIN_GEAR_DETECT_SPEED_KMH
  )
    return null;

  // The gearbox ratio the sample implies: the rpm this speed would need in a 1.00 gear.
  const observedRatio = rpm / engineRpmAt(speedKmh, 1, finalDrive, tyreCircumferenceMm);
  let bestGear: number | null = null;
  let bestError = tolerance;
  gearRatios.forEach((ratio, i) => {
    const error = Math.abs(observedRatio / ratio - 1);
    if (error <= bestError) {
      bestGear = i + 1;
      bestError = error;
    }
  });
  return bestGear;
}

export interface SpeedTableRow {
  gear: number;
  ratio: number;
  kmhPer1000Rpm: number;
  kmhAtRevLimit: number;
}

export interface SpeedTableInput {
  gearRatios: readonly number[];
  finalDrive: number;
  tyreCircumferenceMm: number;
  revLimitRpm: number;
}

/** One row per gear: road speed per 1000 rpm and at the rev limit. */
export function speedTable({
  gearRatios,
  finalDrive,
  tyreCircumferenceMm,
  revLimitRpm,
}: SpeedTableInput): SpeedTableRow[] {
  assertPositive('Rev limit', revLimitRpm);
  return gearRatios.map((ratio, i) => ({
    gear: i + 1,
    ratio,
    kmhPer1000Rpm: roadSpeedKmh(1000, ratio, finalDrive, tyreCircumferenceMm),
    kmhAtRevLimit: roadSpeedKmh(revLimitRpm, ratio, finalDrive, tyreCircumferenceMm),
  }));
}

/** 1 mile = 1609.344 m exactly (international yard and pound agreement, 1959). */
export const kmhToMph = (kmh: number): number => kmh / KM_PER_MILE;
export const mphToKmh = (mph: number): number => mph * KM_PER_MILE;

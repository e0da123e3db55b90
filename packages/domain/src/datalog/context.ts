import { gearFromRpmAndSpeed } from '../vehicles/drivetrain';
import { rollingCircumference } from '../vehicles/tyre';
import type { AnalysisSettings } from './settings';
import type { DatalogSeries } from './series';

/** The drivetrain facts needed to tell the gear from rpm and road speed when no gear channel is logged. */
export interface DatalogVehicle {
  gearRatios: readonly number[];
  finalDrive: number;
  /** Metric tyre size such as "245/40R20". */
  tyreSize: string;
  /** Measured distance per wheel turn; when given it replaces the size's unloaded circumference. */
  rollingCircumferenceMm?: number | null;
}

export interface AnalysisContext {
  series: DatalogSeries;
  settings: AnalysisSettings;
  rows: number;
  time: Float64Array;
  rpm: Float32Array | undefined;
  /** Pedal where logged, else throttle: what the driver asked for. */
  drive: { channel: 'pedal_pos' | 'throttle_pos'; values: Float32Array } | undefined;
  running: (i: number) => boolean;
  gearAt: (i: number) => number | null;
  /** Whether gearAt can answer at all (gear channel, or vehicle with rpm and speed). */
  gearKnown: boolean;
}

export function createContext(
  series: DatalogSeries,
  settings: AnalysisSettings,
  vehicle?: DatalogVehicle,
): AnalysisContext {
  const {
    rpm,
    pedal_pos: pedal,
    throttle_pos: throttle,
    gear,
    vehicle_speed: speed,
  } = series.channels;
  const drive =
    pedal !== undefined
      ? { channel: 'pedal_pos' as const, values: pedal }
      : throttle !== undefined
        ? { channel: 'throttle_pos' as const, values: throttle }
        : undefined;
  const running =
    rpm === undefined ? () => true : (i: number) => (rpm[i] as number) >= settings.engineRunningRpm;

  let gearAt: (i: number) => number | null = () => null;
  let gearKnown = false;
  if (gear !== undefined) {
    gearKnown = true;
    gearAt = (i) => {
      const g = Math.round(gear[i] as number);
      return Number.isFinite(g) && g > 0 ? g : null;
    };
  } else if (vehicle !== undefined && rpm !== undefined && speed !== undefined) {
    gearKnown = true;
    const circumference = rollingCircumference(vehicle).circumferenceMm;
    gearAt = (i) =>
      gearFromRpmAndSpeed(
        rpm[i] as number,
        speed[i] as number,
        vehicle.gearRatios,
        vehicle.finalDrive,
        circumference,
        settings.gearTolerance,
      );
  }
  return {
    series,
    settings,
    rows: series.rows,
    time: series.time,
    rpm,
    drive,
    running,
    gearAt,
    gearKnown,
  };
}

/** Index ranges [start, end] (inclusive) where `inside(i)` holds, bridging gaps up to `gapS`, at least `minS` long. */
export function findRuns(
  time: Float64Array,
  inside: (i: number) => boolean,
  gapS: number,
  minS: number,
): [number, number][] {
  const runs: [number, number][] = [];
  let start = -1;
  let last = -1;
  for (let i = 0; i < time.length; i++) {
    if (inside(i)) {
      if (start < 0) start = i;
      last = i;
    } else if (start >= 0 && (time[i] as number) - (time[last] as number) > gapS) {
      runs.push([start, last]);
      start = -1;
    }
  }
  if (start >= 0) runs.push([start, last]);
  return runs.filter(([s, e]) => (time[e] as number) - (time[s] as number) >= minS);
}

export const round = (value: number, digits = 2): number => {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
};

/** Median of the values (sorted in place). */
export function median(values: number[]): number {
  values.sort((a, b) => a - b);
  return values[Math.floor(values.length / 2)] ?? Number.NaN;
}

import { describe, expect, it } from 'vitest';
import { roadSpeedKmh } from '../vehicles/drivetrain';
import { createContext } from './context';
import type { DatalogSeries } from './series';
import { DEFAULT_ANALYSIS_SETTINGS } from './settings';

// A one-gear test box; the checks depend only on the [CALC] road-speed rule, not on any real car.
const VEHICLE = { gearRatios: [1.0], finalDrive: 3.15, tyreSize: '245/40R20' };
const MEASURED_MM = 2050;

/** 3000 rpm at the road speed a tyre rolling MEASURED_MM per turn gives: 3000·2.050·60/(1000·3.15) = 117.14 km/h [CALC]. */
function logAtMeasuredSpeed(): DatalogSeries {
  const speed = roadSpeedKmh(3000, 1.0, 3.15, MEASURED_MM);
  return {
    rows: 1,
    time: Float64Array.of(0),
    channels: { rpm: Float32Array.of(3000), vehicle_speed: Float32Array.of(speed) },
  } as unknown as DatalogSeries;
}

describe('gear detection uses the rolling circumference the vehicle states', () => {
  it('finds the gear with the measured circumference', () => {
    const ctx = createContext(logAtMeasuredSpeed(), DEFAULT_ANALYSIS_SETTINGS, {
      ...VEHICLE,
      rollingCircumferenceMm: MEASURED_MM,
    });
    expect(ctx.gearAt(0)).toBe(1);
  });

  it('misses it with the unloaded size, 7.9 % longer than the measured turn', () => {
    // π·704.0 = 2211.7 mm; 2211.7/2050 − 1 = 7.9 %, beyond the default 5 % gear tolerance [CALC]
    const ctx = createContext(logAtMeasuredSpeed(), DEFAULT_ANALYSIS_SETTINGS, VEHICLE);
    expect(ctx.gearAt(0)).toBeNull();
  });
});

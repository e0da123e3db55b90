import type { FuelSpec } from '../vehicles/fuel';
import type { CanonicalChannel } from './channels';

/** Every threshold the analysis uses; callers override single fields. Sources in the comments ([CP] = common practice). */
export interface AnalysisSettings {
  /** Below this the engine is off or cranking; idle is 600–900 rpm [CP]. */
  engineRunningRpm: number;
  /** Coolant at or above this is a warm engine: REFERENCES "warm engine" 80–105 °C [CP]. */
  warmCoolantC: number;
  /** Pedal (or throttle) at or above this is full throttle, "pedal on the floor" [CP]. */
  wotThresholdPct: number;
  /** Shortest full-throttle stretch that counts as a pull. */
  wotMinDurationS: number;
  /** Pedal dips shorter than this do not split a pull (a foot wobble, a logger hiccup). */
  wotGapS: number;
  /** First part of a pull left out of the lambda comparison: the tip-in transient while the wideband catches up. */
  wotSettleS: number;
  /** A sustained pedal above this that never reaches full throttle is a half-hearted pull. */
  partialPedalPct: number;
  wotRpmBinWidth: number;
  wotMinSamplesPerBin: number;
  /** Target when commanded lambda is not logged: NA gasoline 0.85–0.90 (REFERENCES "full-throttle λ target") [CP]. */
  wotDefaultTargetLambda: number;
  /** Trim grid: 500 rpm × 10 kPa cells [CP]. */
  trimRpmBinWidth: number;
  trimMapBinWidthKpa: number;
  /** Trim grid on the airflow axis (MAF cars): 5 g/s steps, a tenth of a 2 L engine's cruise range [CP]. */
  trimMafBinWidthGs: number;
  /** Bank 1 and bank 2 trims of one cell further apart than this (percentage points) is a split worth a look [CP]. */
  bankSplitPct: number;
  /** Warm closed-loop cruise reads λ 1; an AFR column whose cruise median is further off than this is on another scale. */
  afrScaleTolerancePct: number;
  /** Give λ-based fuel corrections; off for diesel, which runs lean by design. */
  lambdaCorrections: boolean;
  /** Road speed below this tells no gear from the rpm/speed ratio (clutch slip, rounding of a slow speed). */
  gearRatioMinSpeedKmh: number;
  /** Fewer samples than this in a cell is noise, not a trend. */
  trimMinSamples: number;
  /** Closed loop means commanded λ within this of 1 (where commanded λ is logged). */
  closedLoopLambdaTolerance: number;
  /** Pedal at or below this with rpm above decelMinRpm is a coast-down, often with fuel cut. */
  decelPedalPct: number;
  decelMinRpm: number;
  /** Measured λ above this means the injectors are off (fuel cut). */
  fuelCutLambda: number;
  /** Knock samples closer than this belong to one burst. */
  knockGapS: number;
  /** Relative ratio mismatch allowed when the gear is worked out from rpm and road speed. */
  gearTolerance: number;
  /** A gear counts in a pull when it was held at least this long. */
  gearMinS: number;
  /** A channel stuck on one value this long while rpm swings by flatlineRpmSwing is a dead sensor. */
  flatlineMinS: number;
  flatlineRpmSwing: number;
  /** Temperatures change slowly: stuck for the whole drive and at least this long. */
  temperatureFlatlineMinS: number;
  /** Blank runs or time gaps at least this long are dropouts. */
  dropoutMinS: number;
  /** Samples outside the physical range needed before a channel is flagged (one spike is not a sensor fault). */
  outOfRangeMinSamples: number;
  /** Physical limits per channel in canonical units. */
  physicalLimits: Partial<Record<CanonicalChannel, readonly [number, number]>>;
}

export const DEFAULT_ANALYSIS_SETTINGS: Readonly<AnalysisSettings> = {
  engineRunningRpm: 400,
  warmCoolantC: 80,
  wotThresholdPct: 95,
  wotMinDurationS: 1.5,
  wotGapS: 0.3,
  wotSettleS: 0.3,
  partialPedalPct: 40,
  wotRpmBinWidth: 500,
  wotMinSamplesPerBin: 3,
  wotDefaultTargetLambda: 0.85,
  trimRpmBinWidth: 500,
  trimMapBinWidthKpa: 10,
  trimMafBinWidthGs: 5,
  // Twice a cell's "good" band (±5 %, REFERENCES "healthy trim band" [CP]) would hide a bank problem: 5 points apart flags it.
  bankSplitPct: 5,
  // Narrow-band closed loop holds λ within about ±1 % of stoich [CP]; E10 read on petrol's scale is 4.3 % off [CALC].
  afrScaleTolerancePct: 3,
  lambdaCorrections: true,
  gearRatioMinSpeedKmh: 10,
  trimMinSamples: 20,
  closedLoopLambdaTolerance: 0.03,
  decelPedalPct: 1,
  decelMinRpm: 1500,
  fuelCutLambda: 1.3,
  knockGapS: 0.5,
  gearTolerance: 0.05,
  gearMinS: 0.5,
  flatlineMinS: 60,
  flatlineRpmSwing: 1000,
  temperatureFlatlineMinS: 300,
  dropoutMinS: 0.5,
  outOfRangeMinSamples: 3,
  // Sensor ranges: maf and spark_advance are SAE J1979 scaling limits (PID 10: 0–655.35 g/s; PID 0E: −64 to 63.5°)
  // [3P: formulas as publicly tabulated]; every other range is a plausibility limit, what an engine can do [CP].
  physicalLimits: {
    rpm: [0, 12000],
    vehicle_speed: [0, 400],
    coolant_temp: [-40, 150],
    intake_air_temp: [-40, 120],
    map: [10, 400],
    maf: [0, 655.35],
    throttle_pos: [-1, 101],
    pedal_pos: [-1, 101],
    stft_b1: [-100, 100],
    ltft_b1: [-100, 100],
    stft_b2: [-100, 100],
    ltft_b2: [-100, 100],
    lambda_cmd: [0.5, 1.6],
    lambda_meas: [0.5, 1.6],
    knock_retard: [0, 30],
    spark_advance: [-64, 64],
    // SAE J1979 PID 0x33 reads 0–255 kPa; the air itself is 50–110 kPa from 5,000 m to sea level [CALC, ISO 2533].
    baro: [50, 110],
    ethanol_pct: [0, 100],
    oil_temp: [-40, 160],
    // Port injection runs 250–600 kPa, direct injection up to about 35 MPa [CP].
    fuel_pressure: [0, 40000],
  },
};

/**
 * λ thresholds by fuel. λ already divides out each fuel's stoichiometric ratio, so every spark-ignition fuel
 * (petrol, ethanol blends, methanol) shares one set; diesel runs lean by design (λ 1.3 and far above at part
 * load [CP]), so it gets no λ corrections, no fuel-cut cut-off and a wide plausible range.
 */
export function fuelLambdaSettings(fuel: FuelSpec): Partial<AnalysisSettings> {
  if (fuel.kind !== 'diesel') return {};
  return {
    lambdaCorrections: false,
    fuelCutLambda: Number.POSITIVE_INFINITY,
    physicalLimits: {
      ...DEFAULT_ANALYSIS_SETTINGS.physicalLimits,
      lambda_cmd: [0.5, 10],
      lambda_meas: [0.5, 10],
    },
  };
}

import type { CanonicalChannel } from './channels';

/** What the tuner asks the next log to hold (DESIGN "log request"). */
export interface LogRequest {
  channels: CanonicalChannel[];
  /** Minutes of driving before the first full-throttle pull. */
  warmupMinutes: number;
  /** Gears to pull through at full throttle. */
  wotGears: number;
  notes: string;
}

/** Warm up about five minutes; the first log needs one full-throttle gear, later logs two or three ([CP], REFERENCES "Logging practice"). */
export const DEFAULT_WARMUP_MINUTES = 5;
export const FIRST_LOG_WOT_GEARS = 1;
export const LATER_LOG_WOT_GEARS = 2;

const BASE_CHANNELS: CanonicalChannel[] = [
  'time',
  'rpm',
  'vehicle_speed',
  'coolant_temp',
  'intake_air_temp',
  'map',
  'pedal_pos',
  'throttle_pos',
  'stft_b1',
  'ltft_b1',
  'lambda_cmd',
  'lambda_meas',
  'knock_retard',
  'spark_advance',
];

// Engine families whose logs need more than the base set: V engines have a second bank of trims.
const FAMILY_EXTRA_CHANNELS: Readonly<Record<string, CanonicalChannel[]>> = {
  v6: ['stft_b2', 'ltft_b2'],
  v8: ['stft_b2', 'ltft_b2'],
  v10: ['stft_b2', 'ltft_b2'],
  v12: ['stft_b2', 'ltft_b2'],
  flat6: ['stft_b2', 'ltft_b2'],
};

/**
 * The shop's starting point for a log request. `engineFamily` is free text such as "v8" or "i4 turbo"; a V or
 * flat layout adds bank-2 trims. `round` 1 asks for one gear, later rounds for two.
 */
export function defaultLogRequest(engineFamily?: string, round = 1): LogRequest {
  const key = (engineFamily ?? '').toLowerCase().replace(/[^a-z0-9]/g, '');
  const extra =
    Object.entries(FAMILY_EXTRA_CHANNELS).find(([family]) => key.startsWith(family))?.[1] ?? [];
  return {
    channels: [...BASE_CHANNELS, ...extra],
    warmupMinutes: DEFAULT_WARMUP_MINUTES,
    wotGears: round <= 1 ? FIRST_LOG_WOT_GEARS : LATER_LOG_WOT_GEARS,
    notes:
      'Warm the engine for about five minutes, drive normally for a few minutes, then press the pedal to the floor through the requested gears.',
  };
}

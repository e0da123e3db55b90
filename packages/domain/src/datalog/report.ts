import type { CanonicalChannel } from './channels';

export type CheckId =
  'required_channels' | 'engine_warm' | 'full_throttle' | 'wot_gears' | 'sensor_sanity';
export type CheckStatus = 'pass' | 'warn' | 'fail';

export interface DatalogCheck {
  id: CheckId;
  status: CheckStatus;
  /** A plain sentence for the customer. */
  message: string;
}

export type Range = [number, number];

export interface FuelTrimCell {
  rpm: Range;
  map: Range;
  samples: number;
  /** ECU's sign: positive = the ECU is adding fuel (the engine runs lean). Short + long, banks averaged. */
  meanTrimPct: number;
  /** Fuel-table change that removes the trim, positive = add fuel; new = old·(1 + correctionPct/100). */
  correctionPct: number;
}

export interface FuelTrimGrid {
  /** Lower edges of the rpm bins that hold cells. */
  rpmAxis: number[];
  /** Lower edges of the MAP bins (kPa absolute) that hold cells. */
  mapAxis: number[];
  cells: FuelTrimCell[];
}

export interface LambdaErrorBin {
  rpm: Range;
  samples: number;
  /** (measured λ / commanded λ − 1)·100, positive = lean. */
  meanErrorPct: number;
  /** Fuel change that removes it, positive = add fuel: exactly (λmeas/λcmd − 1)·100. */
  fuelCorrectionPct: number;
}

export interface WotPull {
  startS: number;
  endS: number;
  /** Gears held during the pull, in order; empty when the gear cannot be told. */
  gears: number[];
  rpmStart: number;
  rpmEnd: number;
  maxPedalPct: number;
  lambdaError: LambdaErrorBin[];
}

export interface KnockEvent {
  timeS: number;
  rpm: number | null;
  map: number | null;
  gear: number | null;
  retardDeg: number;
  durationS: number;
}

export type SensorIssueKind = 'flatline' | 'out_of_range' | 'dropout';

export interface SensorIssue {
  channel: CanonicalChannel;
  issue: SensorIssueKind;
  message: string;
}

export interface DatalogReport {
  rows: number;
  durationS: number;
  sampleRateHz: number;
  /** Canonical channel → source header. */
  channels: Partial<Record<CanonicalChannel, string>>;
  /** Canonical channel → unit found in the source ("°F", "psi (gauge)", "AFR (stoich 14.70)"). */
  units: Partial<Record<CanonicalChannel, string>>;
  headerSignature: string;
  fuel: { label: string; stoichAfr: number };
  /** Assumptions the importer made, in plain words. */
  notes: string[];
  checks: DatalogCheck[];
  fuelTrim: FuelTrimGrid;
  wot: { pulls: WotPull[] };
  knock: { events: KnockEvent[]; maxRetardDeg: number };
  sensors: SensorIssue[];
}

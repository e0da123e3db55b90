import type { CanonicalChannel } from './channels';

export type CheckId =
  | 'required_channels'
  | 'engine_warm'
  | 'full_throttle'
  | 'wot_gears'
  | 'sensor_sanity'
  | 'afr_scale'
  | 'bank_split';
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
  /** MAP bin, kPa absolute (grid on the MAP axis). */
  map?: Range;
  /** Airflow bin, g/s (grid on the MAF axis). */
  maf?: Range;
  samples: number;
  /** ECU's sign: positive = the ECU is adding fuel (the engine runs lean). Short + long, banks averaged. */
  meanTrimPct: number;
  /** Fuel-table change that removes the trim, positive = add fuel; new = old·(1 + correctionPct/100). */
  correctionPct: number;
  /** Short + long trim of each bank alone, where that bank is logged. */
  bank1TrimPct?: number;
  bank2TrimPct?: number;
  /** bank 1 − bank 2 when both are logged; beyond the shop's bankSplitPct it raises the bank_split check. */
  bankSplitPct?: number;
}

export type TrimAxis = 'map' | 'maf';

export interface FuelTrimGrid {
  /** Lower edges of the rpm bins that hold cells. */
  rpmAxis: number[];
  /** Lower edges of the MAP bins (kPa absolute) that hold cells; empty on the MAF axis. */
  mapAxis: number[];
  /** Load axis of the grid: manifold pressure or airflow. */
  axis: TrimAxis;
  /** Lower edges of the airflow bins (g/s) that hold cells; empty on the MAP axis. */
  mafAxis: number[];
  cells: FuelTrimCell[];
}

export interface LambdaErrorBin {
  rpm: Range;
  samples: number;
  /** (measured λ / commanded λ − 1)·100, positive = lean. */
  meanErrorPct: number;
  /**
   * Fuel change that removes it, positive = add fuel: exactly (λmeas/λcmd − 1)·100. Null when withheld: an AFR
   * scale that disagrees with cruise (see afrScale), or a diesel.
   */
  fuelCorrectionPct: number | null;
}

export interface WotPull {
  startS: number;
  endS: number;
  /** Gears held during the pull, in order; empty when the gear cannot be told. */
  gears: number[];
  /** How many gears were held, from the gear channel, the vehicle's ratios or the steps of the rpm/speed ratio; null when unknown. */
  gearsHeld: number | null;
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

export interface AfrScaleReport {
  /** Scale the AFR columns were read with. */
  scale: 'fuel' | 'gasoline';
  /** The user stated it (CLI `--afr-scale`, the mapping dialog); unstated it is the fuel's. */
  stated: boolean;
  /** Channels logged as AFR; empty when every lambda column is in λ. */
  channels: CanonicalChannel[];
  /** Median measured AFR during warm cruise, as logged. */
  cruiseMedianAfr: number | null;
  /** The stoichiometric ratio that cruise should read on the chosen scale. */
  expectedAfr: number | null;
  /** (cruiseMedianAfr / expectedAfr − 1)·100. */
  mismatchPct: number | null;
  /** Full-throttle fuel corrections are held back until the scale is confirmed. */
  correctionsWithheld: boolean;
  reason: string | null;
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
  /** Headers no channel took, so a user sees what could still be mapped. */
  unmapped: string[];
  fuel: {
    label: string;
    stoichAfr: number;
    /** Logged ethanol content (%), where an ethanol channel was read; stoich then follows it per sample. */
    ethanolPct?: { min: number; median: number; max: number };
  };
  afrScale: AfrScaleReport;
  /** Assumptions the importer made, in plain words. */
  notes: string[];
  checks: DatalogCheck[];
  fuelTrim: FuelTrimGrid;
  wot: { pulls: WotPull[] };
  knock: { events: KnockEvent[]; maxRetardDeg: number };
  sensors: SensorIssue[];
}

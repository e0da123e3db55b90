import { CHANNEL_INFO, type CanonicalChannel } from './channels';
import { round, type AnalysisContext } from './context';
import type { SensorIssue } from './report';

/** Channels that must move when rpm swings: a stuck value there is a dead sensor, not a steady engine. */
const FLATLINE_CHANNELS: readonly CanonicalChannel[] = [
  'map',
  'maf',
  'throttle_pos',
  'lambda_meas',
  'spark_advance',
];
const TEMPERATURE_CHANNELS: readonly CanonicalChannel[] = ['coolant_temp', 'intake_air_temp'];
/** A time step this many times the usual one is a gap, not jitter. */
const TIME_GAP_FACTOR = 5;

const fmt = (value: number, unit: string) =>
  `${round(value, 1)}${unit === '' || unit === '%' || unit === '°' || unit === '°C' ? '' : ' '}${unit}`;

/**
 * Dropouts, impossible readings and a stuck value of one channel, in a single pass over its samples (a
 * million-row log has a million samples per channel; three passes each cost as much as the one).
 */
function scanChannel(
  ctx: AnalysisContext,
  channel: CanonicalChannel,
  values: Float32Array,
): SensorIssue[] {
  const { label, unit, quantity } = CHANNEL_INFO[channel];
  const { rows, time, rpm, settings } = ctx;
  const runningRpm = settings.engineRunningRpm;
  // Dropouts: runs of blank samples at least dropoutMinS long.
  let dropRuns = 0;
  let dropLongest = 0;
  let valid = 0;
  let blankStart = -1;
  // Out of range: readings outside the physical limits; a wideband reads off-scale lean on a coast-down (no fault).
  const limits = settings.physicalLimits[channel];
  const lo = limits?.[0] ?? -Infinity;
  const hi = limits?.[1] ?? Infinity;
  const mid = (lo + hi) / 2;
  const drive = ctx.drive?.values;
  const skipCoast = quantity === 'lambda' && drive !== undefined;
  let outside = 0;
  let worst = Number.NaN;
  // Flatline: one value held while the engine runs (temperatures: the whole drive; others: while rpm swings).
  const temperature = TEMPERATURE_CHANNELS.includes(channel);
  let watchFlat = temperature || (FLATLINE_CHANNELS.includes(channel) && rpm !== undefined);
  let stuck: { value: number; seconds: number } | null = null;
  let first = -1;
  let last = -1;
  let flatStart = -1;
  let rpmMin = Infinity;
  let rpmMax = -Infinity;

  for (let i = 0; i <= rows; i++) {
    const inside = i < rows;
    const v = inside ? (values[i] as number) : Number.NaN;
    const finite = Number.isFinite(v);
    const running = inside && (rpm === undefined || (rpm[i] as number) >= runningRpm);

    if (inside && !finite) {
      if (blankStart < 0) blankStart = i;
    } else {
      if (inside) valid++;
      if (blankStart >= 0) {
        const span =
          (time[Math.min(rows - 1, i)] as number) - (time[Math.max(0, blankStart - 1)] as number);
        if (span >= settings.dropoutMinS) {
          dropRuns++;
          dropLongest = Math.max(dropLongest, span);
        }
        blankStart = -1;
      }
    }

    if (
      finite &&
      (v < lo || v > hi) &&
      !(skipCoast && (drive[i] as number) <= settings.decelPedalPct)
    ) {
      outside++;
      if (Number.isNaN(worst) || Math.abs(v - mid) > Math.abs(worst - mid)) worst = v;
    }

    if (!watchFlat) continue;
    if (temperature) {
      if (!running || !finite) continue;
      if (first < 0) first = i;
      else if (v !== values[first]) watchFlat = false;
      last = i;
      continue;
    }
    const r = inside ? (rpm?.[i] as number) : Number.NaN;
    if (flatStart >= 0 && running && v === values[flatStart]) {
      if (r < rpmMin) rpmMin = r;
      if (r > rpmMax) rpmMax = r;
      continue;
    }
    if (flatStart >= 0) {
      const seconds = (time[i - 1] as number) - (time[flatStart] as number);
      if (seconds >= settings.flatlineMinS && rpmMax - rpmMin >= settings.flatlineRpmSwing) {
        stuck = { value: values[flatStart] as number, seconds };
        watchFlat = false;
        continue;
      }
    }
    flatStart = running && finite ? i : -1;
    rpmMin = flatStart >= 0 ? r : Infinity;
    rpmMax = flatStart >= 0 ? r : -Infinity;
  }
  if (temperature && watchFlat && first >= 0) {
    const seconds = (time[last] as number) - (time[first] as number);
    if (seconds >= settings.temperatureFlatlineMinS)
      stuck = { value: values[first] as number, seconds };
  }

  const issues: SensorIssue[] = [];
  if (valid === 0)
    issues.push({
      channel,
      issue: 'dropout',
      message: `The ${label} column is in the log but holds no readings.`,
    });
  else if (dropRuns > 0)
    issues.push({
      channel,
      issue: 'dropout',
      message: `The ${label} reading dropped out ${dropRuns === 1 ? 'once' : `${dropRuns} times`} (longest ${round(dropLongest, 1)} s); check the logger connection.`,
    });
  if (limits !== undefined && outside >= settings.outOfRangeMinSamples)
    issues.push({
      channel,
      issue: 'out_of_range',
      message: `The ${label} read ${fmt(worst, unit)} in ${outside} samples, outside the possible ${fmt(lo, unit)} to ${fmt(hi, unit)}; the sensor or its wiring may be faulty.`,
    });
  if (stuck !== null)
    issues.push({
      channel,
      issue: 'flatline',
      message: `The ${label} stayed at ${fmt(stuck.value, unit)} for ${Math.round(stuck.seconds)} s while the engine was running; the sensor may be dead or unplugged.`,
    });
  return issues;
}

function timeGaps(ctx: AnalysisContext): SensorIssue | null {
  const time = ctx.time;
  if (ctx.rows < 3) return null;
  const typical = (time[ctx.rows - 1] as number) / (ctx.rows - 1);
  const limit = Math.max(ctx.settings.dropoutMinS, typical * TIME_GAP_FACTOR);
  let gaps = 0;
  let longest = 0;
  for (let i = 1; i < ctx.rows; i++) {
    const step = (time[i] as number) - (time[i - 1] as number);
    if (step > limit) {
      gaps++;
      longest = Math.max(longest, step);
    }
  }
  if (gaps === 0) return null;
  return {
    channel: 'time',
    issue: 'dropout',
    message: `The logger skipped samples ${gaps === 1 ? 'once' : `${gaps} times`} (longest gap ${round(longest, 1)} s), so some of the drive is missing.`,
  };
}

/** Dead (flat) sensors, impossible readings and dropouts, one entry per channel and kind. */
export function analyzeSensors(ctx: AnalysisContext): SensorIssue[] {
  const issues: SensorIssue[] = [];
  const gaps = timeGaps(ctx);
  if (gaps !== null) issues.push(gaps);
  for (const [channel, values] of Object.entries(ctx.series.channels) as [
    CanonicalChannel,
    Float32Array,
  ][]) {
    issues.push(...scanChannel(ctx, channel, values));
  }
  return issues;
}

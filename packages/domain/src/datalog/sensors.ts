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

function dropouts(
  ctx: AnalysisContext,
  channel: CanonicalChannel,
  values: Float32Array,
): SensorIssue | null {
  const label = CHANNEL_INFO[channel].label;
  const time = ctx.time;
  let runs = 0;
  let longest = 0;
  let valid = 0;
  let start = -1;
  for (let i = 0; i <= ctx.rows; i++) {
    const blank = i < ctx.rows && !Number.isFinite(values[i] as number);
    if (blank) {
      if (start < 0) start = i;
      continue;
    }
    if (i < ctx.rows) valid++;
    if (start >= 0) {
      const from = time[Math.max(0, start - 1)] as number;
      const to = time[Math.min(ctx.rows - 1, i)] as number;
      if (to - from >= ctx.settings.dropoutMinS) {
        runs++;
        longest = Math.max(longest, to - from);
      }
      start = -1;
    }
  }
  if (valid === 0)
    return {
      channel,
      issue: 'dropout',
      message: `The ${label} column is in the log but holds no readings.`,
    };
  if (runs === 0) return null;
  return {
    channel,
    issue: 'dropout',
    message: `The ${label} reading dropped out ${runs === 1 ? 'once' : `${runs} times`} (longest ${round(longest, 1)} s); check the logger connection.`,
  };
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

function outOfRange(
  ctx: AnalysisContext,
  channel: CanonicalChannel,
  values: Float32Array,
): SensorIssue | null {
  const limits = ctx.settings.physicalLimits[channel];
  if (limits === undefined) return null;
  const [lo, hi] = limits;
  const drive = ctx.drive?.values;
  // A wideband reads off-scale lean while the injectors are off on a coast-down: that is no sensor fault.
  const skipCoast = CHANNEL_INFO[channel].quantity === 'lambda' && drive !== undefined;
  let count = 0;
  let worst = Number.NaN;
  for (let i = 0; i < ctx.rows; i++) {
    const v = values[i] as number;
    if (!Number.isFinite(v) || (v >= lo && v <= hi)) continue;
    if (skipCoast && (drive[i] as number) <= ctx.settings.decelPedalPct) continue;
    count++;
    if (Number.isNaN(worst) || Math.abs(v - (lo + hi) / 2) > Math.abs(worst - (lo + hi) / 2))
      worst = v;
  }
  if (count < ctx.settings.outOfRangeMinSamples) return null;
  const { label, unit } = CHANNEL_INFO[channel];
  return {
    channel,
    issue: 'out_of_range',
    message: `The ${label} read ${fmt(worst, unit)} in ${count} samples, outside the possible ${fmt(lo, unit)} to ${fmt(hi, unit)}; the sensor or its wiring may be faulty.`,
  };
}

function flatline(
  ctx: AnalysisContext,
  channel: CanonicalChannel,
  values: Float32Array,
): SensorIssue | null {
  const rpm = ctx.rpm;
  const time = ctx.time;
  const { flatlineMinS, flatlineRpmSwing } = ctx.settings;
  const label = CHANNEL_INFO[channel].label;
  const stuck = (value: number, seconds: number): SensorIssue => ({
    channel,
    issue: 'flatline',
    message: `The ${label} stayed at ${fmt(value, CHANNEL_INFO[channel].unit)} for ${Math.round(seconds)} s while the engine was running; the sensor may be dead or unplugged.`,
  });
  if (TEMPERATURE_CHANNELS.includes(channel)) {
    let first = -1;
    let last = -1;
    for (let i = 0; i < ctx.rows; i++) {
      if (!ctx.running(i) || !Number.isFinite(values[i] as number)) continue;
      if (first < 0) first = i;
      else if (values[i] !== values[first]) return null;
      last = i;
    }
    const seconds = first < 0 ? 0 : (time[last] as number) - (time[first] as number);
    return seconds >= ctx.settings.temperatureFlatlineMinS
      ? stuck(values[first] as number, seconds)
      : null;
  }
  if (rpm === undefined) return null;
  let start = -1;
  let rpmMin = Infinity;
  let rpmMax = -Infinity;
  for (let i = 0; i <= ctx.rows; i++) {
    const continues = i < ctx.rows && start >= 0 && ctx.running(i) && values[i] === values[start];
    if (continues) {
      const r = rpm[i] as number;
      if (r < rpmMin) rpmMin = r;
      if (r > rpmMax) rpmMax = r;
      continue;
    }
    if (start >= 0) {
      const seconds = (time[i - 1] as number) - (time[start] as number);
      if (seconds >= flatlineMinS && rpmMax - rpmMin >= flatlineRpmSwing)
        return stuck(values[start] as number, seconds);
    }
    start = i < ctx.rows && ctx.running(i) && Number.isFinite(values[i] as number) ? i : -1;
    rpmMin = start >= 0 ? (rpm[start] as number) : Infinity;
    rpmMax = start >= 0 ? (rpm[start] as number) : -Infinity;
  }
  return null;
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
    const found = [
      dropouts(ctx, channel, values),
      outOfRange(ctx, channel, values),
      FLATLINE_CHANNELS.includes(channel) || TEMPERATURE_CHANNELS.includes(channel)
        ? flatline(ctx, channel, values)
        : null,
    ];
    for (const issue of found) if (issue !== null) issues.push(issue);
  }
  return issues;
}

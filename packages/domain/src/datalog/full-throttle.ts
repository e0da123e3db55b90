import { findRuns, round, type AnalysisContext } from './context';
import type { LambdaErrorBin, WotPull } from './report';

/**
 * Lambda error of one sample, in percent: (λmeas/λcmd − 1)·100, positive = lean.
 * Fuel per cycle is air / (λ · stoich), so reaching λcmd at the same airflow takes the fuel multiplied by
 * exactly λmeas/λcmd: the fuel correction equals the error, with no first-order approximation.
 */
export function lambdaErrorPct(measured: number, commanded: number): number {
  return (measured / commanded - 1) * 100;
}

/** Full-throttle stretches: pedal (else throttle) at or above the threshold with the engine running. */
export function findPulls(ctx: AnalysisContext): [number, number][] {
  const drive = ctx.drive;
  if (drive === undefined) return [];
  const { wotThresholdPct, wotGapS, wotMinDurationS } = ctx.settings;
  return findRuns(
    ctx.time,
    (i) => (drive.values[i] as number) >= wotThresholdPct && ctx.running(i),
    wotGapS,
    wotMinDurationS,
  );
}

/** Sustained pedal above partialPedalPct that never reached full throttle: a pull with the pedal not on the floor. */
export function findPartialPulls(
  ctx: AnalysisContext,
  pulls: [number, number][],
): { run: [number, number]; maxPct: number }[] {
  const drive = ctx.drive;
  if (drive === undefined) return [];
  const { partialPedalPct, wotGapS, wotMinDurationS, wotThresholdPct } = ctx.settings;
  const runs = findRuns(
    ctx.time,
    (i) => (drive.values[i] as number) >= partialPedalPct && ctx.running(i),
    wotGapS,
    wotMinDurationS,
  );
  return runs
    .filter(([s, e]) => !pulls.some(([ps, pe]) => ps <= e && pe >= s))
    .map((run) => ({ run, maxPct: maxOf(drive.values, run[0], run[1]) }))
    .filter(({ maxPct }) => maxPct < wotThresholdPct);
}

function maxOf(values: Float32Array, start: number, end: number): number {
  let max = -Infinity;
  for (let i = start; i <= end; i++) if ((values[i] as number) > max) max = values[i] as number;
  return max;
}

/** Gears held at least gearMinS during the run, in the order they were first held. */
function gearsIn(ctx: AnalysisContext, start: number, end: number): number[] {
  const held = new Map<number, number>();
  for (let i = start + 1; i <= end; i++) {
    const gear = ctx.gearAt(i);
    if (gear === null) continue;
    held.set(gear, (held.get(gear) ?? 0) + ((ctx.time[i] as number) - (ctx.time[i - 1] as number)));
  }
  return [...held].filter(([, seconds]) => seconds >= ctx.settings.gearMinS).map(([gear]) => gear);
}

/**
 * rpm per km/h of each gear held in the run, in order, with neither a gear channel nor the vehicle's ratios: in
 * one gear rpm/speed is constant (overall ratio ÷ tyre circumference), and each shift steps it. Stretches
 * shorter than gearMinS (the shift itself, clutch slip) are not gears. Null when rpm or speed is not logged.
 */
export function ratioSteps(ctx: AnalysisContext, start: number, end: number): number[] | null {
  const speed = ctx.series.channels.vehicle_speed;
  const rpm = ctx.rpm;
  if (speed === undefined || rpm === undefined) return null;
  const { gearTolerance, gearMinS, gearRatioMinSpeedKmh } = ctx.settings;
  const time = ctx.time;
  const levels: number[] = [];
  let first = -1;
  let last = -1;
  let sum = 0;
  let n = 0;
  const close = () => {
    if (first < 0 || (time[last] as number) - (time[first] as number) < gearMinS) return;
    const level = sum / n;
    const previous = levels.at(-1);
    if (previous === undefined || Math.abs(level / previous - 1) > gearTolerance) levels.push(level);
  };
  for (let i = start; i <= end; i++) {
    const v = speed[i] as number;
    const r = rpm[i] as number;
    if (!(v >= gearRatioMinSpeedKmh) || !(r > 0)) {
      close();
      first = -1;
      continue;
    }
    const ratio = r / v;
    if (first >= 0 && Math.abs(ratio / (sum / n) - 1) <= gearTolerance) {
      sum += ratio;
      n++;
      last = i;
      continue;
    }
    close();
    first = i;
    last = i;
    sum = ratio;
    n = 1;
  }
  close();
  return levels;
}

/** Distinct gears over all pulls from their rpm/speed steps (one gear pulled twice counts once); null when not logged. */
export function countRatioGears(ctx: AnalysisContext, runs: [number, number][]): number | null {
  const distinct: number[] = [];
  for (const [start, end] of runs) {
    const levels = ratioSteps(ctx, start, end);
    if (levels === null) return null;
    for (const level of levels)
      if (!distinct.some((d) => Math.abs(level / d - 1) <= ctx.settings.gearTolerance))
        distinct.push(level);
  }
  return distinct.length;
}

function lambdaErrors(
  ctx: AnalysisContext,
  start: number,
  end: number,
  withhold: boolean,
): LambdaErrorBin[] {
  const { lambda_meas: measured, lambda_cmd: commanded } = ctx.series.channels;
  const rpm = ctx.rpm;
  if (measured === undefined || rpm === undefined || !ctx.settings.lambdaCorrections) return [];
  const { wotSettleS, wotRpmBinWidth, wotMinSamplesPerBin, wotDefaultTargetLambda } = ctx.settings;
  const from = (ctx.time[start] as number) + wotSettleS;
  const bins = new Map<number, { sum: number; n: number }>();
  for (let i = start; i <= end; i++) {
    if ((ctx.time[i] as number) < from) continue;
    const meas = measured[i] as number;
    const cmd = commanded === undefined ? wotDefaultTargetLambda : (commanded[i] as number);
    const r = rpm[i] as number;
    if (!(meas > 0) || !(cmd > 0) || !Number.isFinite(r)) continue;
    const lo = Math.floor(r / wotRpmBinWidth) * wotRpmBinWidth;
    const bin = bins.get(lo) ?? { sum: 0, n: 0 };
    bin.sum += lambdaErrorPct(meas, cmd);
    bin.n++;
    bins.set(lo, bin);
  }
  return [...bins]
    .filter(([, b]) => b.n >= wotMinSamplesPerBin)
    .sort(([a], [b]) => a - b)
    .map(([lo, b]) => {
      const meanErrorPct = round(b.sum / b.n);
      return {
        rpm: [lo, lo + wotRpmBinWidth],
        samples: b.n,
        meanErrorPct,
        fuelCorrectionPct: withhold ? null : meanErrorPct,
      };
    });
}

/** Each pull's gears and λ error; `withholdCorrections` blanks the fuel corrections (an AFR scale in doubt). */
export function analyzePulls(
  ctx: AnalysisContext,
  pulls: [number, number][],
  withholdCorrections = false,
): WotPull[] {
  const drive = ctx.drive;
  return pulls.map(([start, end]) => {
    const gears = gearsIn(ctx, start, end);
    return {
      startS: round(ctx.time[start] as number),
      endS: round(ctx.time[end] as number),
      gears,
      gearsHeld: ctx.gearKnown ? gears.length : (ratioSteps(ctx, start, end)?.length ?? null),
      rpmStart: round(ctx.rpm?.[start] ?? Number.NaN, 0),
      rpmEnd: round(ctx.rpm?.[end] ?? Number.NaN, 0),
      maxPedalPct: drive === undefined ? 0 : round(maxOf(drive.values, start, end), 1),
      lambdaError: lambdaErrors(ctx, start, end, withholdCorrections),
    };
  });
}

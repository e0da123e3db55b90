import { STOICH_AFR } from '../vehicles/fuel';
import type { CanonicalChannel } from './channels';
import { median, round, type AnalysisContext } from './context';
import type { AfrScaleReport, DatalogCheck } from './report';

/** Fewer warm cruise samples than this (a few seconds at 20 Hz) say nothing about the scale. */
const MIN_CRUISE_SAMPLES = 100;
/** At most this many samples are sorted for a median: a long log is sampled evenly. */
const MEDIAN_SAMPLES = 20001;

/**
 * Warm part-throttle driving outside the pulls: closed loop holds λ 1 there, so an AFR column must read the
 * stoichiometric ratio of the scale it was read with. Commanded λ narrows it to closed loop where it is logged in λ
 * (an AFR-scaled commanded column could be misread itself, so it is not used then).
 */
function cruiseSamples(ctx: AnalysisContext, pulls: [number, number][]): number[] {
  const { coolant_temp: coolant, lambda_cmd: cmd } = ctx.series.channels;
  const cmdInLambda = cmd !== undefined && !ctx.series.afr.channels.includes('lambda_cmd');
  const s = ctx.settings;
  const drive = ctx.drive?.values;
  const rpm = ctx.rpm;
  const inPull = new Uint8Array(ctx.rows);
  for (const [start, end] of pulls) inPull.fill(1, start, end + 1);
  const picked: number[] = [];
  const stride = Math.max(1, Math.floor(ctx.rows / MEDIAN_SAMPLES));
  for (let i = 0; i < ctx.rows; i += stride) {
    if (!ctx.running(i) || inPull[i] === 1) continue;
    if (coolant !== undefined && !((coolant[i] as number) >= s.warmCoolantC)) continue;
    if (cmdInLambda && !(Math.abs((cmd[i] as number) - 1) <= s.closedLoopLambdaTolerance)) continue;
    if (drive !== undefined) {
      const d = drive[i] as number;
      const r = rpm?.[i] ?? 0;
      if (!(d < s.wotThresholdPct) || (d <= s.decelPedalPct && r > s.decelMinRpm)) continue;
    }
    picked.push(i);
  }
  return picked;
}

/**
 * Checks each AFR column against warm closed-loop cruise: read on the right scale it gives λ 1 there. Many
 * wideband controllers print AFR on petrol's scale (λ × 14.7) whatever the fuel; read as E85 AFR that turns
 * λ 0.80 into 1.198 and a fuel correction of +41 % [CALC]. When the scale disagrees with cruise, the full-throttle
 * fuel corrections are withheld until the user states a scale that cruise bears out.
 */
export function analyzeAfrScale(
  ctx: AnalysisContext,
  pulls: [number, number][],
): { report: AfrScaleReport; check: DatalogCheck | null } {
  const afr = ctx.series.afr;
  const base: AfrScaleReport = {
    scale: afr.scale,
    stated: afr.stated,
    channels: afr.channels,
    cruiseMedianAfr: null,
    expectedAfr: null,
    mismatchPct: null,
    correctionsWithheld: false,
    reason: null,
  };
  // Diesel cruises lean by design, so cruise says nothing about the scale.
  if (afr.channels.length === 0 || !ctx.settings.lambdaCorrections) return { report: base, check: null };
  const id = 'afr_scale';
  const fuelStoich = ctx.series.fuel.stoichBySample;
  const stoichAt = (i: number) =>
    afr.scale === 'gasoline'
      ? STOICH_AFR.gasoline
      : ((fuelStoich?.[i] as number | undefined) ?? ctx.series.fuel.stoichAfr);
  const fuelAt = (i: number) =>
    (fuelStoich?.[i] as number | undefined) ?? ctx.series.fuel.stoichAfr;
  const channel: CanonicalChannel = afr.channels.includes('lambda_meas')
    ? 'lambda_meas'
    : (afr.channels[0] as CanonicalChannel);
  const lambda = ctx.series.channels[channel as 'lambda_meas'] as Float32Array;
  const samples = cruiseSamples(ctx, pulls).filter((i) => Number.isFinite(lambda[i] as number));
  const header = ctx.series.mapping.channels[channel]?.header ?? channel;
  if (samples.length < MIN_CRUISE_SAMPLES) {
    return {
      report: base,
      check: {
        id,
        status: 'warn',
        message: `"${header}" is an air-fuel ratio, but the log has too little warm cruise to check which fuel's scale it is written on. Confirm the scale (petrol's 14.7 or the fuel's own) before using its fuel corrections.`,
      },
    };
  }
  const cruiseAfr = median(samples.map((i) => (lambda[i] as number) * stoichAt(i)));
  const expected = median(samples.map(stoichAt));
  const fuelExpected = median(samples.map(fuelAt));
  const mismatch = (cruiseAfr / expected - 1) * 100;
  const report: AfrScaleReport = {
    ...base,
    cruiseMedianAfr: round(cruiseAfr, 2),
    expectedAfr: round(expected, 2),
    mismatchPct: round(mismatch, 1),
  };
  const tolerance = ctx.settings.afrScaleTolerancePct;
  const scaleWords =
    afr.scale === 'gasoline'
      ? `petrol's scale (${STOICH_AFR.gasoline})`
      : `the fuel's scale (${ctx.series.fuel.label}, ${round(fuelExpected, 2)})`;
  if (Math.abs(mismatch) <= tolerance) {
    return {
      report,
      check: {
        id,
        status: 'pass',
        message: `"${header}" reads ${round(cruiseAfr, 1)} AFR in warm cruise, the stoichiometric ratio of ${scaleWords}: its scale is right.`,
      },
    };
  }
  const other = afr.scale === 'gasoline' ? fuelExpected : STOICH_AFR.gasoline;
  const fitsOther = Math.abs((cruiseAfr / other - 1) * 100) <= tolerance;
  const otherWords =
    afr.scale === 'gasoline'
      ? `the fuel's own scale (${round(fuelExpected, 2)})`
      : `petrol's scale (λ × ${STOICH_AFR.gasoline})`;
  const flag = afr.scale === 'gasoline' ? 'fuel' : 'gasoline';
  const likely = fitsOther
    ? ` It looks written on ${otherWords}: state --afr-scale ${flag} (or choose it under "Confirm or fix columns").`
    : ' Check the wideband\'s calibration and the fuel stated for the vehicle.';
  // A stated scale that cruise contradicts is no confirmation: the wideband or the fuel is not what was said.
  const reason = afr.stated
    ? `"${header}" reads ${round(cruiseAfr, 1)} AFR in warm cruise, ${round(mismatch, 0)} % off the ${round(expected, 2)} of ${scaleWords}, the scale that was stated. Fuel corrections are held back until the scale and the fuel agree with the log.`
    : `"${header}" reads ${round(cruiseAfr, 1)} AFR in warm cruise, where ${scaleWords} expects ${round(expected, 2)} (${round(mismatch, 0)} %). Fuel corrections are held back until the scale is confirmed.`;
  return {
    report: { ...report, correctionsWithheld: true, reason },
    check: { id, status: 'warn', message: `${reason}${likely}` },
  };
}

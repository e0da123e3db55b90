import { round, type AnalysisContext } from './context';
import type { FuelTrimGrid } from './report';

/**
 * Fuel-table change for a combined trim, by the trade's rule new = old·(1 + (STFT+LTFT)/100) [CP]:
 * the correction in percent is the trim itself, sign included (positive trim = ECU adding fuel = add fuel).
 */
export function trimCorrectionPct(combinedTrimPct: number): number {
  return combinedTrimPct;
}

/** Short + long trim of one bank at sample i; a bank with neither channel logged gives undefined. */
function bankTrim(
  stft: Float32Array | undefined,
  ltft: Float32Array | undefined,
  i: number,
): number | undefined {
  if (stft === undefined && ltft === undefined) return undefined;
  return (stft?.[i] ?? 0) + (ltft?.[i] ?? 0);
}

/** Closed-loop, warm, part-throttle samples, binned on rpm × MAP. */
export function analyzeFuelTrims(ctx: AnalysisContext, pulls: [number, number][]): FuelTrimGrid {
  const {
    stft_b1,
    ltft_b1,
    stft_b2,
    ltft_b2,
    map,
    coolant_temp: coolant,
    lambda_cmd: cmd,
    lambda_meas: meas,
  } = ctx.series.channels;
  const rpm = ctx.rpm;
  const empty: FuelTrimGrid = { rpmAxis: [], mapAxis: [], cells: [] };
  if (
    rpm === undefined ||
    map === undefined ||
    (stft_b1 === undefined &&
      ltft_b1 === undefined &&
      stft_b2 === undefined &&
      ltft_b2 === undefined)
  ) {
    return empty;
  }
  const s = ctx.settings;
  const inPull = new Uint8Array(ctx.rows);
  for (const [start, end] of pulls) inPull.fill(1, start, end + 1);
  const drive = ctx.drive?.values;

  const cells = new Map<number, { rpmLo: number; mapLo: number; sum: number; n: number }>();
  for (let i = 0; i < ctx.rows; i++) {
    const r = rpm[i] as number;
    const p = map[i] as number;
    if (!ctx.running(i) || inPull[i] === 1 || !Number.isFinite(r) || !Number.isFinite(p)) continue;
    if (coolant !== undefined && !((coolant[i] as number) >= s.warmCoolantC)) continue;
    if (cmd !== undefined && !(Math.abs((cmd[i] as number) - 1) <= s.closedLoopLambdaTolerance))
      continue;
    if (meas !== undefined && (meas[i] as number) > s.fuelCutLambda) continue;
    if (
      drive !== undefined &&
      ((drive[i] as number) >= s.wotThresholdPct ||
        ((drive[i] as number) <= s.decelPedalPct && r > s.decelMinRpm))
    )
      continue;
    const b1 = bankTrim(stft_b1, ltft_b1, i);
    const b2 = bankTrim(stft_b2, ltft_b2, i);
    const trim = b1 !== undefined && b2 !== undefined ? (b1 + b2) / 2 : (b1 ?? b2);
    if (trim === undefined || !Number.isFinite(trim)) continue;
    const rpmLo = Math.floor(r / s.trimRpmBinWidth) * s.trimRpmBinWidth;
    const mapLo = Math.floor(p / s.trimMapBinWidthKpa) * s.trimMapBinWidthKpa;
    const key = (rpmLo / s.trimRpmBinWidth) * 65536 + mapLo / s.trimMapBinWidthKpa;
    const cell = cells.get(key) ?? { rpmLo, mapLo, sum: 0, n: 0 };
    cell.sum += trim;
    cell.n++;
    cells.set(key, cell);
  }

  const kept = [...cells.values()]
    .filter((c) => c.n >= s.trimMinSamples)
    .sort((a, b) => a.rpmLo - b.rpmLo || a.mapLo - b.mapLo);
  if (kept.length === 0) return empty;
  const axis = (values: number[], width: number) => {
    const lo = Math.min(...values);
    const hi = Math.max(...values);
    return Array.from({ length: Math.round((hi - lo) / width) + 1 }, (_, k) => lo + k * width);
  };
  return {
    rpmAxis: axis(
      kept.map((c) => c.rpmLo),
      s.trimRpmBinWidth,
    ),
    mapAxis: axis(
      kept.map((c) => c.mapLo),
      s.trimMapBinWidthKpa,
    ),
    cells: kept.map((c) => {
      const meanTrimPct = round(c.sum / c.n);
      return {
        rpm: [c.rpmLo, c.rpmLo + s.trimRpmBinWidth],
        map: [c.mapLo, c.mapLo + s.trimMapBinWidthKpa],
        samples: c.n,
        meanTrimPct,
        correctionPct: round(trimCorrectionPct(c.sum / c.n)),
      };
    }),
  };
}

import { round, type AnalysisContext } from './context';
import type { FuelTrimCell, FuelTrimGrid, Range, TrimAxis } from './report';

/**
 * Fuel-table change for a combined trim, by the trade's rule new = old·(1 + (STFT+LTFT)/100) [CP]:
 * the correction in percent is the trim itself, sign included (positive trim = ECU adding fuel = add fuel).
 */
export function trimCorrectionPct(combinedTrimPct: number): number {
  return combinedTrimPct;
}

/** A cell's load bin on whichever axis its grid uses. */
export const trimCellLoad = (cell: Pick<FuelTrimCell, 'map' | 'maf'>): Range =>
  cell.map ?? cell.maf ?? [Number.NaN, Number.NaN];

/** Load axis name with its unit, for table headings and exports. */
export const trimAxisLabel = (axis: TrimAxis): string => (axis === 'map' ? 'MAP kPa' : 'MAF g/s');

/** The load axis: what the tuner chose, else MAP where logged, else airflow; null when neither is logged. */
export function chooseTrimAxis(ctx: AnalysisContext, wanted?: TrimAxis): TrimAxis | null {
  const { map, maf } = ctx.series.channels;
  if (wanted === 'maf' && maf !== undefined) return 'maf';
  if (wanted === 'map' && map !== undefined) return 'map';
  if (map !== undefined) return 'map';
  return maf !== undefined ? 'maf' : null;
}

/** Closed-loop, warm, part-throttle samples, binned on rpm × MAP (or rpm × airflow), each bank summed apart. */
export function analyzeFuelTrims(
  ctx: AnalysisContext,
  pulls: [number, number][],
  wantedAxis?: TrimAxis,
): FuelTrimGrid {
  const {
    stft_b1,
    ltft_b1,
    stft_b2,
    ltft_b2,
    coolant_temp: coolant,
    lambda_cmd: cmd,
    lambda_meas: meas,
  } = ctx.series.channels;
  const rpm = ctx.rpm;
  const axis = chooseTrimAxis(ctx, wantedAxis) ?? 'map';
  const load = axis === 'map' ? ctx.series.channels.map : ctx.series.channels.maf;
  const empty: FuelTrimGrid = { rpmAxis: [], mapAxis: [], axis, mafAxis: [], cells: [] };
  const bank1 = stft_b1 !== undefined || ltft_b1 !== undefined;
  const bank2 = stft_b2 !== undefined || ltft_b2 !== undefined;
  if (rpm === undefined || load === undefined || (!bank1 && !bank2)) return empty;
  const s = ctx.settings;
  const loadWidth = axis === 'map' ? s.trimMapBinWidthKpa : s.trimMafBinWidthGs;
  const [, loadMax] = s.physicalLimits[axis] ?? [0, 655.35];
  const [, rpmMax] = s.physicalLimits.rpm ?? [0, 12000];
  const rpmBins = Math.floor(rpmMax / s.trimRpmBinWidth) + 1;
  const loadBins = Math.floor(loadMax / loadWidth) + 1;
  const inPull = new Uint8Array(ctx.rows);
  for (const [start, end] of pulls) inPull.fill(1, start, end + 1);
  const drive = ctx.drive?.values;

  // Flat typed arrays, one slot per cell: no object per sample, and the grid is a few kB whatever the log's length.
  const size = rpmBins * loadBins;
  const sum = new Float64Array(size);
  const count = new Uint32Array(size);
  const sum1 = new Float64Array(size);
  const count1 = new Uint32Array(size);
  const sum2 = new Float64Array(size);
  const count2 = new Uint32Array(size);
  const tolerance = s.closedLoopLambdaTolerance;
  for (let i = 0; i < ctx.rows; i++) {
    const r = rpm[i] as number;
    const p = load[i] as number;
    if (!ctx.running(i) || inPull[i] === 1 || !(r >= 0) || !(p >= 0)) continue;
    if (coolant !== undefined && !((coolant[i] as number) >= s.warmCoolantC)) continue;
    if (cmd !== undefined && !(Math.abs((cmd[i] as number) - 1) <= tolerance)) continue;
    if (meas !== undefined && (meas[i] as number) > s.fuelCutLambda) continue;
    if (drive !== undefined) {
      const d = drive[i] as number;
      if (d >= s.wotThresholdPct || (d <= s.decelPedalPct && r > s.decelMinRpm)) continue;
    }
    const ri = Math.floor(r / s.trimRpmBinWidth);
    const li = Math.floor(p / loadWidth);
    if (ri >= rpmBins || li >= loadBins) continue;
    const b1 = bank1 ? (stft_b1?.[i] ?? 0) + (ltft_b1?.[i] ?? 0) : Number.NaN;
    const b2 = bank2 ? (stft_b2?.[i] ?? 0) + (ltft_b2?.[i] ?? 0) : Number.NaN;
    const ok1 = Number.isFinite(b1);
    const ok2 = Number.isFinite(b2);
    if (!ok1 && !ok2) continue;
    const k = ri * loadBins + li;
    if (ok1) {
      sum1[k] = (sum1[k] as number) + b1;
      count1[k] = (count1[k] as number) + 1;
    }
    if (ok2) {
      sum2[k] = (sum2[k] as number) + b2;
      count2[k] = (count2[k] as number) + 1;
    }
    sum[k] = (sum[k] as number) + (ok1 && ok2 ? (b1 + b2) / 2 : ok1 ? b1 : b2);
    count[k] = (count[k] as number) + 1;
  }

  const cells: FuelTrimCell[] = [];
  const rpmLows = new Set<number>();
  const loadLows = new Set<number>();
  for (let k = 0; k < size; k++) {
    const n = count[k] as number;
    if (n < s.trimMinSamples) continue;
    const rpmLo = Math.floor(k / loadBins) * s.trimRpmBinWidth;
    const loadLo = round((k % loadBins) * loadWidth, 3);
    rpmLows.add(rpmLo);
    loadLows.add(loadLo);
    const mean = (sum[k] as number) / n;
    const loadRange: [number, number] = [loadLo, round(loadLo + loadWidth, 3)];
    const cell: FuelTrimCell = {
      rpm: [rpmLo, rpmLo + s.trimRpmBinWidth],
      ...(axis === 'map' ? { map: loadRange } : { maf: loadRange }),
      samples: n,
      meanTrimPct: round(mean),
      correctionPct: round(trimCorrectionPct(mean)),
    };
    const n1 = count1[k] as number;
    const n2 = count2[k] as number;
    if (n1 > 0) cell.bank1TrimPct = round((sum1[k] as number) / n1);
    if (n2 > 0) cell.bank2TrimPct = round((sum2[k] as number) / n2);
    if (n1 >= s.trimMinSamples && n2 >= s.trimMinSamples)
      cell.bankSplitPct = round((sum1[k] as number) / n1 - (sum2[k] as number) / n2);
    cells.push(cell);
  }
  if (cells.length === 0) return empty;
  const axisOf = (lows: Set<number>, width: number) => {
    const lo = Math.min(...lows);
    const hi = Math.max(...lows);
    return Array.from({ length: Math.round((hi - lo) / width) + 1 }, (_, k) =>
      round(lo + k * width, 3),
    );
  };
  const loadAxis = axisOf(loadLows, loadWidth);
  return {
    rpmAxis: axisOf(rpmLows, s.trimRpmBinWidth),
    mapAxis: axis === 'map' ? loadAxis : [],
    axis,
    mafAxis: axis === 'maf' ? loadAxis : [],
    cells,
  };
}

import { describe, expect, it } from 'vitest';
import { compareReports } from './compare-reports';
import type { DatalogCheck, DatalogReport, FuelTrimCell, LambdaErrorBin, TrimAxis } from './report';

const cell = (rpm: [number, number], load: [number, number], meanTrimPct: number, axis: TrimAxis = 'map'): FuelTrimCell => ({
  rpm,
  ...(axis === 'map' ? { map: load } : { maf: load }),
  samples: 50,
  meanTrimPct,
  correctionPct: meanTrimPct,
});
const bin = (rpm: [number, number], samples: number, meanErrorPct: number): LambdaErrorBin => ({ rpm, samples, meanErrorPct, fuelCorrectionPct: meanErrorPct });
const check = (id: DatalogCheck['id'], status: DatalogCheck['status']): DatalogCheck => ({ id, status, message: '' });

/** Only the parts compareReports reads; the rest of a report plays no part in the comparison. */
function report(parts: { axis?: TrimAxis; cells?: FuelTrimCell[]; pulls?: LambdaErrorBin[][]; checks?: DatalogCheck[] }): DatalogReport {
  return {
    checks: parts.checks ?? [],
    fuelTrim: { axis: parts.axis ?? 'map', rpmAxis: [], mapAxis: [], mafAxis: [], cells: parts.cells ?? [] },
    wot: { pulls: (parts.pulls ?? []).map((lambdaError) => ({ startS: 0, endS: 1, gears: [], gearsHeld: null, rpmStart: 0, rpmEnd: 0, maxPedalPct: 100, lambdaError })) },
  } as unknown as DatalogReport;
}

describe('compareReports', () => {
  it('gives other − base per trim cell, and null where only one log has the cell', () => {
    const base = report({ cells: [cell([2000, 2500], [40, 50], 6.5), cell([1500, 2000], [40, 50], -3)] });
    const other = report({ cells: [cell([2000, 2500], [40, 50], 1.25), cell([2500, 3000], [60, 70], 2)] });
    const { fuelTrim } = compareReports(base, other);
    // 1.25 − 6.5 = −5.25 [CALC]; cells sorted by rpm, then load.
    expect(fuelTrim).toEqual([
      { rpm: [1500, 2000], axis: 'map', map: [40, 50], baseTrimPct: -3, otherTrimPct: null, deltaPct: null },
      { rpm: [2000, 2500], axis: 'map', map: [40, 50], baseTrimPct: 6.5, otherTrimPct: 1.25, deltaPct: -5.25 },
      { rpm: [2500, 3000], axis: 'map', map: [60, 70], baseTrimPct: null, otherTrimPct: 2, deltaPct: null },
    ]);
  });

  it('never pairs cells of grids on different load axes', () => {
    const base = report({ axis: 'map', cells: [cell([2000, 2500], [10, 20], 4)] });
    const other = report({ axis: 'maf', cells: [cell([2000, 2500], [10, 20], 1, 'maf')] });
    const { fuelTrim } = compareReports(base, other);
    expect(fuelTrim.map((c) => [c.axis, c.baseTrimPct, c.otherTrimPct, c.deltaPct])).toEqual([
      ['map', 4, null, null],
      ['maf', null, 1, null],
    ]);
    expect(fuelTrim[1]).toMatchObject({ maf: [10, 20], map: [10, 20] });
  });

  it('pools the lambda error of every pull per rpm bin, weighted by samples', () => {
    // Base: (10·2 + 30·(−2)) / 40 = −1 % [CALC]; other: one pull, 1.5 %; delta 1.5 − (−1) = 2.5 [CALC].
    const base = report({ pulls: [[bin([4000, 4500], 10, 2)], [bin([4000, 4500], 30, -2), bin([5000, 5500], 20, 3.333)]] });
    const other = report({ pulls: [[bin([4000, 4500], 25, 1.5)]] });
    expect(compareReports(base, other).lambdaError).toEqual([
      { rpm: [4000, 4500], baseErrorPct: -1, otherErrorPct: 1.5, deltaPct: 2.5 },
      // Rounded to two decimals: 3.333 → 3.33 [CALC].
      { rpm: [5000, 5500], baseErrorPct: 3.33, otherErrorPct: null, deltaPct: null },
    ]);
  });

  it('lists each check once with its status in both logs', () => {
    const base = report({ checks: [check('engine_warm', 'fail'), check('full_throttle', 'pass')] });
    const other = report({ checks: [check('engine_warm', 'pass'), check('sensor_sanity', 'warn')] });
    expect(compareReports(base, other).checks).toEqual([
      { id: 'engine_warm', base: 'fail', other: 'pass' },
      { id: 'full_throttle', base: 'pass', other: null },
      { id: 'sensor_sanity', base: null, other: 'warn' },
    ]);
  });
});

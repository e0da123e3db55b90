import { trimCellLoad } from './fuel-trim';
import type { DatalogReport, LambdaErrorBin } from './report';

const key = (range: [number, number]) => `${range[0]}:${range[1]}`;

/** Lambda error per rpm bin over all pulls of a log, pooled by sample count. */
function pooledLambdaError(report: DatalogReport): Map<string, { rpm: [number, number]; samples: number; sum: number }> {
  const bins = new Map<string, { rpm: [number, number]; samples: number; sum: number }>();
  for (const bin of report.wot.pulls.flatMap((p) => p.lambdaError) as LambdaErrorBin[]) {
    const entry = bins.get(key(bin.rpm)) ?? { rpm: bin.rpm, samples: 0, sum: 0 };
    entry.samples += bin.samples;
    entry.sum += bin.meanErrorPct * bin.samples;
    bins.set(key(bin.rpm), entry);
  }
  return bins;
}

const round2 = (v: number) => Math.round(v * 100) / 100;
const delta = (a: number | null, b: number | null) => (a === null || b === null ? null : round2(b - a));

/** Before/after of two logs of one job: trims per cell and full-throttle lambda error per rpm bin (other − base). */
export function compareReports(base: DatalogReport, other: DatalogReport) {
  // Cells of grids on different load axes (MAP, airflow) never meet: the axis is part of the key.
  const cellKey = (grid: DatalogReport['fuelTrim'], c: DatalogReport['fuelTrim']['cells'][number]) =>
    `${grid.axis ?? 'map'}|${key(c.rpm)}|${key(trimCellLoad(c))}`;
  const baseCells = new Map(base.fuelTrim.cells.map((c) => [cellKey(base.fuelTrim, c), c]));
  const otherCells = new Map(other.fuelTrim.cells.map((c) => [cellKey(other.fuelTrim, c), c]));
  const cellKeys = [...new Set([...baseCells.keys(), ...otherCells.keys()])];
  const fuelTrim = cellKeys
    .map((k) => {
      const a = baseCells.get(k);
      const b = otherCells.get(k);
      const cell = (a ?? b)!;
      const baseTrimPct = a?.meanTrimPct ?? null;
      const otherTrimPct = b?.meanTrimPct ?? null;
      return {
        rpm: cell.rpm,
        axis: cell.maf ? ('maf' as const) : ('map' as const),
        // `map` stays filled for readers that know only the MAP grid; on the airflow axis it holds the g/s bin.
        map: trimCellLoad(cell),
        ...(cell.maf && { maf: cell.maf }),
        baseTrimPct,
        otherTrimPct,
        deltaPct: delta(baseTrimPct, otherTrimPct),
      };
    })
    .sort((x, y) => x.rpm[0] - y.rpm[0] || trimCellLoad(x)[0] - trimCellLoad(y)[0]);
  const baseBins = pooledLambdaError(base);
  const otherBins = pooledLambdaError(other);
  const lambdaError = [...new Set([...baseBins.keys(), ...otherBins.keys()])]
    .map((k) => {
      const a = baseBins.get(k);
      const b = otherBins.get(k);
      const baseErrorPct = a ? round2(a.sum / a.samples) : null;
      const otherErrorPct = b ? round2(b.sum / b.samples) : null;
      return { rpm: (a ?? b)!.rpm, baseErrorPct, otherErrorPct, deltaPct: delta(baseErrorPct, otherErrorPct) };
    })
    .sort((x, y) => x.rpm[0] - y.rpm[0]);
  const checks = [...new Set([...base.checks, ...other.checks].map((c) => c.id))].map((id) => ({
    id,
    base: base.checks.find((c) => c.id === id)?.status ?? null,
    other: other.checks.find((c) => c.id === id)?.status ?? null,
  }));
  return { checks, fuelTrim, lambdaError };
}
export type ReportComparison = ReturnType<typeof compareReports>;

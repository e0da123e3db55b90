import { toCsv } from '../csv';
import { trimAxisLabel, trimCellLoad } from './fuel-trim';
import type { DatalogReport } from './report';

/**
 * Fuel-trim corrections as a grid a tuner pastes next to the fuel table: one row per rpm bin, one column per
 * MAP (or airflow) bin, cells hold correctionPct (blank where the cell had too few samples).
 */
export function trimGridToCsv(report: DatalogReport): string {
  const { rpmAxis, cells } = report.fuelTrim;
  const axis = report.fuelTrim.axis ?? 'map';
  const loadAxis = axis === 'map' ? report.fuelTrim.mapAxis : report.fuelTrim.mafAxis;
  const corner = `rpm \\ ${trimAxisLabel(axis)}`;
  const first = cells[0];
  if (first === undefined) return toCsv([corner], []);
  const rpmWidth = first.rpm[1] - first.rpm[0];
  const [loadLo, loadHi] = trimCellLoad(first);
  const loadWidth = loadHi - loadLo;
  const byCell = new Map(cells.map((c) => [`${c.rpm[0]}:${trimCellLoad(c)[0]}`, c.correctionPct]));
  return toCsv(
    [corner, ...loadAxis.map((m) => `${m}-${+(m + loadWidth).toFixed(3)}`)],
    rpmAxis.map((r) => [`${r}-${r + rpmWidth}`, ...loadAxis.map((m) => byCell.get(`${r}:${m}`))]),
  );
}

/** Full-throttle lambda error per pull and rpm bin, one row each. */
export function wotTableToCsv(report: DatalogReport): string {
  return toCsv(
    [
      'pull',
      'start_s',
      'gears',
      'rpm_from',
      'rpm_to',
      'samples',
      'mean_error_pct',
      'fuel_correction_pct',
    ],
    report.wot.pulls.flatMap((pull, i) =>
      pull.lambdaError.map((bin) => [
        i + 1,
        pull.startS,
        pull.gears.join(' '),
        bin.rpm[0],
        bin.rpm[1],
        bin.samples,
        bin.meanErrorPct,
        bin.fuelCorrectionPct,
      ]),
    ),
  );
}

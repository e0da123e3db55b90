import { toCsv } from '../csv';
import type { DatalogReport } from './report';

/**
 * Fuel-trim corrections as a grid a tuner pastes next to the fuel table: one row per rpm bin, one column per
 * MAP bin, cells hold correctionPct (blank where the cell had too few samples).
 */
export function trimGridToCsv(report: DatalogReport): string {
  const { rpmAxis, mapAxis, cells } = report.fuelTrim;
  const first = cells[0];
  if (first === undefined) return toCsv(['rpm \\ MAP kPa'], []);
  const rpmWidth = first.rpm[1] - first.rpm[0];
  const mapWidth = first.map[1] - first.map[0];
  const byCell = new Map(cells.map((c) => [`${c.rpm[0]}:${c.map[0]}`, c.correctionPct]));
  return toCsv(
    ['rpm \\ MAP kPa', ...mapAxis.map((m) => `${m}-${m + mapWidth}`)],
    rpmAxis.map((r) => [`${r}-${r + rpmWidth}`, ...mapAxis.map((m) => byCell.get(`${r}:${m}`))]),
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

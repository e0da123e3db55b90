import { useState } from 'react';
import { trimAxisLabel, trimCellLoad, type FuelTrimCell, type FuelTrimGrid } from '@revloop/domain/datalog';
import { Select } from '../../../components/ui/select';
import { formatSigned } from '../../../lib/format';

/**
 * ColorBrewer "RdBu" 11-class diverging scheme (Cynthia Brewer, colorbrewer2.org, marked colour-blind safe there),
 * listed red to blue. Red is lean (the ECU adds fuel), blue is rich (it takes fuel away), white is on target.
 */
export const RDBU_11 = ['#67001f', '#b2182b', '#d6604d', '#f4a582', '#fddbc7', '#f7f7f7', '#d1e5f0', '#92c5de', '#4393c3', '#2166ac', '#053061'] as const;

/** The colour scale spans ±10 %, the edge of an acceptable combined trim ([CP], REFERENCES "healthy trim band"). */
const SCALE_PCT = 10;

export function trimColour(trimPct: number): { background: string; text: string } {
  const clamped = Math.max(-SCALE_PCT, Math.min(SCALE_PCT, trimPct));
  const index = Math.round(((SCALE_PCT - clamped) / (2 * SCALE_PCT)) * (RDBU_11.length - 1));
  const dark = index <= 1 || index >= RDBU_11.length - 2;
  return { background: RDBU_11[index] as string, text: dark ? '#ffffff' : '#191d1b' };
}


type TrimView = 'mean' | 'bank1' | 'bank2' | 'split';

const VIEWS: { value: TrimView; label: string }[] = [
  { value: 'mean', label: 'Banks averaged' },
  { value: 'bank1', label: 'Bank 1' },
  { value: 'bank2', label: 'Bank 2' },
  { value: 'split', label: 'Bank 1 − bank 2' },
];

const valueOf = (cell: FuelTrimCell, view: TrimView): number | undefined =>
  view === 'mean' ? cell.meanTrimPct : view === 'bank1' ? cell.bank1TrimPct : view === 'bank2' ? cell.bank2TrimPct : cell.bankSplitPct;

/** Mean fuel trim per rpm × MAP (or airflow) cell as a heat table; each cell also prints its number, so colour is never the only cue. */
export function TrimHeatTable({ grid }: { grid: FuelTrimGrid }) {
  const [view, setView] = useState<TrimView>('mean');
  if (grid.cells.length === 0) {
    return <p className="text-sm text-ink-600">No cell had enough warm closed-loop samples to show a trim.</p>;
  }
  const axis = grid.axis ?? 'map';
  const loadAxis = axis === 'map' ? grid.mapAxis : grid.mafAxis;
  const first = grid.cells[0]!;
  const [loadLo, loadHi] = trimCellLoad(first);
  const loadWidth = loadHi - loadLo;
  const rpmWidth = first.rpm[1] - first.rpm[0];
  const byCell = new Map(grid.cells.map((c) => [`${c.rpm[0]}:${trimCellLoad(c)[0]}`, c]));
  const twoBanks = grid.cells.some((c) => c.bankSplitPct !== undefined);
  const loadName = axis === 'map' ? 'manifold pressure' : 'airflow';
  return (
    <div className="flex flex-col gap-3">
      {twoBanks && (
        <label className="flex items-center gap-2 text-sm text-ink-800">
          Show
          <Select className="w-auto" options={VIEWS} value={view} onChange={(e) => setView(e.target.value as TrimView)} />
        </label>
      )}
      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Fuel trim grid">
        <table className="border-collapse text-xs" aria-label={`${view === 'mean' ? 'Mean' : (VIEWS.find((v) => v.value === view)?.label ?? '')} fuel trim by engine speed and ${loadName}`}>
          <thead>
            <tr>
              <th scope="col" className="px-2 py-1 text-left font-medium text-ink-600">
                rpm \ {trimAxisLabel(axis)}
              </th>
              {loadAxis.map((m) => (
                <th key={m} scope="col" className="px-2 py-1 font-medium text-ink-600">
                  {m}–{+(m + loadWidth).toFixed(3)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {grid.rpmAxis.map((r) => (
              <tr key={r}>
                <th scope="row" className="px-2 py-1 text-left font-medium whitespace-nowrap text-ink-600">
                  {r}–{r + rpmWidth}
                </th>
                {loadAxis.map((m) => {
                  const cell = byCell.get(`${r}:${m}`);
                  const value = cell && valueOf(cell, view);
                  if (!cell || value === undefined) return <td key={m} className="border border-white bg-ink-50 px-2 py-1 text-center text-ink-400">·</td>;
                  const colour = trimColour(value);
                  const banks = cell.bank1TrimPct !== undefined && cell.bank2TrimPct !== undefined ? `; bank 1 ${formatSigned(cell.bank1TrimPct)} %, bank 2 ${formatSigned(cell.bank2TrimPct)} %` : '';
                  return (
                    <td
                      key={m}
                      className="border border-white px-2 py-1 text-center tabular-nums"
                      style={{ background: colour.background, color: colour.text }}
                      title={`${cell.samples} samples; mean trim ${formatSigned(cell.meanTrimPct)} %, correction ${formatSigned(cell.correctionPct)} %${banks}`}
                    >
                      {formatSigned(value)}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex items-center gap-2 text-xs text-ink-700" aria-hidden="true">
        <span>rich (ECU removes fuel) −{SCALE_PCT} %</span>
        <span className="flex">
          {[...RDBU_11].reverse().map((c) => (
            <span key={c} className="h-3 w-5" style={{ background: c }} />
          ))}
        </span>
        <span>+{SCALE_PCT} % lean (ECU adds fuel)</span>
      </div>
      <p className="text-xs text-ink-600">
        Cells show the mean short + long term trim of warm, closed-loop driving. The correction to the fuel table is new = old × (1 + trim/100).
      </p>
    </div>
  );
}

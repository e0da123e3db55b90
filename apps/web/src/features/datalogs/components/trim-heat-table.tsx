import type { FuelTrimGrid } from '@revloop/domain/datalog';

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

const fmt = (v: number) => `${v > 0 ? '+' : ''}${v.toFixed(1)}`;

/** Mean fuel trim per rpm × MAP cell as a heat table; each cell also prints its number, so colour is never the only cue. */
export function TrimHeatTable({ grid }: { grid: FuelTrimGrid }) {
  if (grid.cells.length === 0) {
    return <p className="text-sm text-ink-600">No cell had enough warm closed-loop samples to show a trim.</p>;
  }
  const first = grid.cells[0]!;
  const mapWidth = first.map[1] - first.map[0];
  const rpmWidth = first.rpm[1] - first.rpm[0];
  const byCell = new Map(grid.cells.map((c) => [`${c.rpm[0]}:${c.map[0]}`, c]));
  return (
    <div className="flex flex-col gap-3">
      <div className="overflow-x-auto">
        <table className="border-collapse text-xs" aria-label="Mean fuel trim by engine speed and manifold pressure">
          <thead>
            <tr>
              <th scope="col" className="px-2 py-1 text-left font-medium text-ink-600">
                rpm \ MAP kPa
              </th>
              {grid.mapAxis.map((m) => (
                <th key={m} scope="col" className="px-2 py-1 font-medium text-ink-600">
                  {m}–{m + mapWidth}
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
                {grid.mapAxis.map((m) => {
                  const cell = byCell.get(`${r}:${m}`);
                  if (!cell) return <td key={m} className="border border-white bg-ink-50 px-2 py-1 text-center text-ink-400">·</td>;
                  const colour = trimColour(cell.meanTrimPct);
                  return (
                    <td
                      key={m}
                      className="border border-white px-2 py-1 text-center tabular-nums"
                      style={{ background: colour.background, color: colour.text }}
                      title={`${cell.samples} samples; mean trim ${fmt(cell.meanTrimPct)} %, correction ${fmt(cell.correctionPct)} %`}
                    >
                      {fmt(cell.meanTrimPct)}
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

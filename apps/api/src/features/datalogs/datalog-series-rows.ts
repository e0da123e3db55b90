import type { CanonicalChannel } from '@revloop/domain/datalog';
import type { SeriesColumns } from './datalog-series';

type ValueChannel = Exclude<CanonicalChannel, 'time'>;

/**
 * The same rows of every asked channel between `from` and `to` seconds, for plotting one channel against another:
 * rows where any of them is blank are left out, and the rest are thinned by an even stride to at most `points`
 * (an even stride samples the scatter without bias; LTTB picks different rows per channel, so it cannot pair them).
 */
export function sampleAlignedRows(
  columns: SeriesColumns,
  channels: readonly ValueChannel[],
  from: number,
  to: number,
  points: number,
): { t: number[]; values: Map<ValueChannel, number[]> } {
  const { time } = columns;
  const arrays = channels.map((c) => columns[c]).filter((a): a is Float32Array => a !== undefined);
  const kept: number[] = [];
  for (let i = 0; i < time.length; i++) {
    const t = time[i] as number;
    if (t < from || t > to + 1e-9) continue;
    if (arrays.every((a) => Number.isFinite(a[i] as number))) kept.push(i);
  }
  const stride = Math.max(1, Math.ceil(kept.length / points));
  const picked = kept.filter((_, k) => k % stride === 0);
  const round = (x: number) => Math.round(x * 1000) / 1000;
  const values = new Map<ValueChannel, number[]>();
  for (const c of channels) {
    const column = columns[c];
    if (column) values.set(c, picked.map((i) => round(column[i] as number)));
  }
  return { t: picked.map((i) => round(time[i] as number)), values };
}

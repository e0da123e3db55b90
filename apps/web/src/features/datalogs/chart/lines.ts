import type { CanonicalChannel } from '@revloop/domain/datalog';

/** A channel offered in a picker, with its canonical unit. */
export interface ChannelChoice {
  channel: CanonicalChannel;
  label: string;
  unit: string;
}

/** A stretch of a log in seconds from its start. */
export interface Stretch {
  from: number;
  to: number;
}

/** One drawn line: a channel of one log, its times already on the chart's axis (shifted when logs are aligned). */
export interface ChartLine {
  key: string;
  channel: CanonicalChannel;
  label: string;
  unit: string;
  colour: string;
  /** Which log it is from, when two are overlaid; its lines are dashed. */
  source: string;
  dashed: boolean;
  t: number[];
  v: number[];
}

export type ChartRow = { t: number } & Record<string, number>;

/** One row per time stamp of any line; each line was downsampled on its own, so the others are blank there. */
export function mergeRows(lines: readonly Pick<ChartLine, 'key' | 't' | 'v'>[]): ChartRow[] {
  const rows = new Map<number, ChartRow>();
  for (const line of lines) {
    line.t.forEach((t, i) => {
      const row = rows.get(t) ?? ({ t } as ChartRow);
      row[line.key] = line.v[i] as number;
      rows.set(t, row);
    });
  }
  return [...rows.values()].sort((a, b) => a.t - b.t);
}


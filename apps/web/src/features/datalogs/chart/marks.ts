import type { DatalogReport, WotPull } from '@revloop/domain/datalog';
import { formatClock } from './time';

export interface TimeMarks {
  pulls: { startS: number; endS: number; label: string }[];
  knock: { timeS: number; label: string; dashed: boolean }[];
}

/** "Pull 1: 5:20–5:28, gear 3" — how a pull is named in every picker. */
export const pullLabel = (pull: WotPull, i: number) =>
  `Pull ${i + 1}: ${formatClock(pull.startS)}–${formatClock(pull.endS)}${pull.gears.length > 0 ? `, gear${pull.gears.length > 1 ? 's' : ''} ${pull.gears.join('–')}` : ''}`;

/** Pull shading and knock lines of one log, shifted by `shiftS` onto the chart's axis. */
export function marksOf(report: DatalogReport, shiftS = 0, dashed = false, prefix = ''): TimeMarks {
  return {
    pulls: report.wot.pulls.map((p, i) => ({ startS: p.startS - shiftS, endS: p.endS - shiftS, label: `${prefix}Pull ${i + 1}` })),
    knock: report.knock.events.map((e) => ({ timeS: e.timeS - shiftS, label: `${prefix}knock −${e.retardDeg.toFixed(1)}°`, dashed })),
  };
}

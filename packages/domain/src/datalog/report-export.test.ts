import { describe, expect, it } from 'vitest';
import type { DatalogReport } from './report';
import { trimGridToCsv, wotTableToCsv } from './report-export';

const report = {
  fuelTrim: {
    rpmAxis: [2000, 2500],
    mapAxis: [40, 50],
    cells: [
      { rpm: [2000, 2500], map: [40, 50], samples: 30, meanTrimPct: 8, correctionPct: 8 },
      { rpm: [2500, 3000], map: [50, 60], samples: 25, meanTrimPct: -2.5, correctionPct: -2.5 },
    ],
  },
  wot: {
    pulls: [
      {
        startS: 12.5,
        endS: 17,
        gears: [2, 3],
        rpmStart: 2500,
        rpmEnd: 6500,
        maxPedalPct: 100,
        lambdaError: [{ rpm: [5000, 5500], samples: 9, meanErrorPct: 6, fuelCorrectionPct: 6 }],
      },
    ],
  },
} as unknown as DatalogReport;

describe('report CSV export', () => {
  it('writes the trim corrections as an rpm × MAP grid with blanks for empty cells', () => {
    expect(trimGridToCsv(report)).toBe(
      'rpm \\ MAP kPa,40-50,50-60\r\n2000-2500,8,\r\n2500-3000,,-2.5\r\n',
    );
  });

  it('writes one row per pull and rpm bin', () => {
    expect(wotTableToCsv(report)).toBe(
      'pull,start_s,gears,rpm_from,rpm_to,samples,mean_error_pct,fuel_correction_pct\r\n1,12.5,2 3,5000,5500,9,6,6\r\n',
    );
  });
});

import {
  engineWarmCheck,
  fullThrottleCheck,
  requiredChannelsCheck,
  sensorSanityCheck,
  wotGearsCheck,
} from './checks';
import { createContext, round, type DatalogVehicle } from './context';
import { analyzeFuelTrims } from './fuel-trim';
import { analyzePulls, findPartialPulls, findPulls } from './full-throttle';
import { analyzeKnock } from './knock';
import { defaultLogRequest, type LogRequest } from './log-request';
import type { DatalogReport } from './report';
import { analyzeSensors } from './sensors';
import type { CsvInput } from './csv-reader';
import { readDatalog, type DatalogSeries, type ReadDatalogOptions } from './series';
import { DEFAULT_ANALYSIS_SETTINGS, type AnalysisSettings } from './settings';

export interface AnalyzeOptions extends ReadDatalogOptions {
  vehicle?: DatalogVehicle;
  logRequest?: LogRequest;
  settings?: Partial<AnalysisSettings>;
}

/** The report for a log already in canonical units (see readDatalog). */
export function analyzeDatalogSeries(
  series: DatalogSeries,
  options: Omit<AnalyzeOptions, 'fuel' | 'map'> = {},
): DatalogReport {
  const settings: AnalysisSettings = { ...DEFAULT_ANALYSIS_SETTINGS, ...options.settings };
  const request = options.logRequest ?? defaultLogRequest();
  const ctx = createContext(series, settings, options.vehicle);

  const pullRuns = findPulls(ctx);
  const pulls = analyzePulls(ctx, pullRuns);
  const partials = findPartialPulls(ctx, pullRuns);
  const sensors = analyzeSensors(ctx);
  const durationS = series.rows > 1 ? (series.time[series.rows - 1] as number) : 0;
  const notes = [...series.notes];
  if (series.channels.lambda_cmd === undefined && series.channels.lambda_meas !== undefined) {
    notes.push(
      `Commanded lambda was not logged; full-throttle lambda is compared with a target of ${settings.wotDefaultTargetLambda}.`,
    );
  }
  const report: DatalogReport = {
    rows: series.rows,
    durationS: round(durationS),
    sampleRateHz: durationS > 0 ? round((series.rows - 1) / durationS) : 0,
    channels: Object.fromEntries(
      Object.entries(series.mapping.channels).map(([channel, mapped]) => [channel, mapped.header]),
    ),
    units: series.units,
    headerSignature: series.mapping.signature,
    fuel: { label: series.fuel.label, stoichAfr: round(series.fuel.stoichAfr, 3) },
    notes,
    checks: [
      requiredChannelsCheck(ctx, request),
      engineWarmCheck(ctx, pullRuns, request),
      fullThrottleCheck(ctx, pulls, partials),
      wotGearsCheck(ctx, pulls, request),
      sensorSanityCheck(sensors),
    ],
    fuelTrim: analyzeFuelTrims(ctx, pullRuns),
    wot: { pulls },
    knock: analyzeKnock(ctx),
    sensors,
  };
  options.onProgress?.(1);
  return report;
}

/** Bytes of a CSV datalog → the report JSON of DESIGN "Datalog report contract". */
export function analyzeDatalog(bytes: CsvInput, options: AnalyzeOptions = {}): DatalogReport {
  return analyzeDatalogSeries(readDatalog(bytes, options), options);
}

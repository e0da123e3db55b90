import { analyzeAfrScale } from './afr-scale';
import {
  bankSplitCheck,
  engineWarmCheck,
  fullThrottleCheck,
  requiredChannelsCheck,
  sensorSanityCheck,
  wotGearsCheck,
} from './checks';
import { stoichAfr } from '../vehicles/fuel';
import { createContext, median, round, type DatalogVehicle } from './context';
import { analyzeFuelTrims } from './fuel-trim';
import { analyzePulls, countRatioGears, findPartialPulls, findPulls } from './full-throttle';
import { analyzeKnock } from './knock';
import { defaultLogRequest, type LogRequest } from './log-request';
import type { DatalogCheck, DatalogReport, TrimAxis } from './report';
import { analyzeSensors } from './sensors';
import type { CsvInput } from './csv-reader';
import { readDatalog, type DatalogSeries, type ReadDatalogOptions } from './series';
import { DEFAULT_ANALYSIS_SETTINGS, fuelLambdaSettings, type AnalysisSettings } from './settings';

export interface AnalyzeOptions extends ReadDatalogOptions {
  vehicle?: DatalogVehicle;
  logRequest?: LogRequest;
  settings?: Partial<AnalysisSettings>;
  /** Load axis of the trim grid; unstated it is MAP where logged, else airflow. */
  trimAxis?: TrimAxis;
}

function ethanolSummary(series: DatalogSeries): DatalogReport['fuel']['ethanolPct'] {
  const ethanol = series.channels.ethanol_pct;
  if (ethanol === undefined || series.fuel.stoichBySample === undefined) return undefined;
  const valid = Array.from(ethanol).filter((v) => Number.isFinite(v) && v >= 0 && v <= 100);
  if (valid.length === 0) return undefined;
  const mid = median(valid);
  return {
    min: round(valid[0] as number, 1),
    median: round(mid, 1),
    max: round(valid.at(-1) as number, 1),
  };
}

/** The report for a log already in canonical units (see readDatalog). */
export function analyzeDatalogSeries(
  series: DatalogSeries,
  options: Omit<AnalyzeOptions, 'fuel' | 'map'> = {},
): DatalogReport {
  const settings: AnalysisSettings = {
    ...DEFAULT_ANALYSIS_SETTINGS,
    ...fuelLambdaSettings(series.fuel.spec),
    ...options.settings,
  };
  const request = options.logRequest ?? defaultLogRequest();
  const ctx = createContext(series, settings, options.vehicle);

  const pullRuns = findPulls(ctx);
  const afrScale = analyzeAfrScale(ctx, pullRuns);
  const pulls = analyzePulls(ctx, pullRuns, afrScale.report.correctionsWithheld);
  const fuelTrim = analyzeFuelTrims(ctx, pullRuns, options.trimAxis);
  const partials = findPartialPulls(ctx, pullRuns);
  const sensors = analyzeSensors(ctx);
  const durationS = series.rows > 1 ? (series.time[series.rows - 1] as number) : 0;
  const notes = [...series.notes];
  if (series.channels.lambda_cmd === undefined && series.channels.lambda_meas !== undefined) {
    notes.push(
      `Commanded lambda was not logged; full-throttle lambda is compared with a target of ${settings.wotDefaultTargetLambda}.`,
    );
  }
  if (!settings.lambdaCorrections && series.channels.lambda_meas !== undefined) {
    notes.push(
      `${series.fuel.label} runs lean by design, so no full-throttle lambda corrections are given.`,
    );
  }
  if (series.fuel.spec.kind === 'ethanol_blend' && series.fuel.stoichBySample === undefined && series.fuel.spec.ethanolPct >= 51) {
    notes.push(
      `Pump E85 holds 51–83 % ethanol (ASTM D5798), so its stoichiometric ratio lies between ${round(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 83 }), 2)} and ${round(stoichAfr({ kind: 'ethanol_blend', ethanolPct: 51 }), 2)}; ${series.fuel.label} is assumed. Log the ethanol content to read it sample by sample.`,
    );
  }
  if (options.trimAxis !== undefined && fuelTrim.axis !== options.trimAxis) {
    notes.push(
      `The trim grid was asked for on the ${options.trimAxis === 'maf' ? 'airflow' : 'MAP'} axis, but that channel is not logged; it uses ${fuelTrim.axis === 'maf' ? 'airflow' : 'MAP'}.`,
    );
  }
  const extraChecks = [afrScale.check, bankSplitCheck(ctx, fuelTrim)].filter(
    (c): c is DatalogCheck => c !== null,
  );
  const ethanolPct = ethanolSummary(series);
  const report: DatalogReport = {
    rows: series.rows,
    durationS: round(durationS),
    sampleRateHz: durationS > 0 ? round((series.rows - 1) / durationS) : 0,
    channels: Object.fromEntries(
      Object.entries(series.mapping.channels).map(([channel, mapped]) => [channel, mapped.header]),
    ),
    units: series.units,
    headerSignature: series.mapping.signature,
    unmapped: series.mapping.unmapped,
    fuel: {
      label: series.fuel.label,
      stoichAfr: round(
        ethanolPct === undefined
          ? series.fuel.stoichAfr
          : stoichAfr({ kind: 'ethanol_blend', ethanolPct: ethanolPct.median }),
        3,
      ),
      ...(ethanolPct !== undefined && { ethanolPct }),
    },
    afrScale: afrScale.report,
    notes,
    checks: [
      requiredChannelsCheck(ctx, request),
      engineWarmCheck(ctx, pullRuns, request),
      fullThrottleCheck(ctx, pulls, partials),
      wotGearsCheck(ctx, pulls, request, ctx.gearKnown ? null : countRatioGears(ctx, pullRuns)),
      sensorSanityCheck(sensors),
      ...extraChecks,
    ],
    fuelTrim,
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

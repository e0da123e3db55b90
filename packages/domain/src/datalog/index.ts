export { analyzeDatalog, analyzeDatalogSeries, type AnalyzeOptions } from './analyze';
export {
  CANONICAL_CHANNELS,
  CHANNEL_ALIASES,
  CHANNEL_INFO,
  isCanonicalChannel,
  type CanonicalChannel,
} from './channels';
export type { DatalogVehicle } from './context';
export {
  CSV_HEAD_BYTES,
  detectCsvLayout,
  parseCsvColumns,
  type CsvInput,
  type CsvLayout,
  type CsvSource,
} from './csv-reader';
export {
  datalogMappingInputSchema,
  datalogVehicleSchema,
  logRequestSchema,
  type DatalogMappingInput,
} from './datalog.schemas';
export { lambdaErrorPct } from './full-throttle';
export { trimAxisLabel, trimCellLoad, trimCorrectionPct } from './fuel-trim';
export {
  headerSignature,
  mapHeaders,
  normaliseHeaderName,
  type HeaderMapping,
  type MappedColumn,
} from './header-mapping';
export { DEFAULT_WARMUP_MINUTES, defaultLogRequest, type LogRequest } from './log-request';
export type * from './report';
export {
  AFR_SCALES,
  readDatalog,
  type AfrScale,
  type DatalogSeries,
  type ReadDatalogOptions,
} from './series';
export { DEFAULT_ANALYSIS_SETTINGS, fuelLambdaSettings, type AnalysisSettings } from './settings';
export { STANDARD_ATMOSPHERE_KPA, UNIT_CHOICES, isUnitOf, unitConversion } from './units';
export { trimGridToCsv, wotTableToCsv } from './report-export';
export { compareReports, type ReportComparison } from './compare-reports';
export { CHECK_TITLES, checkTitle } from './check-titles';

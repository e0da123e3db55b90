import { DomainError } from '../errors';
import { fuelLabel, stoichAfr, type FuelSpec } from '../vehicles/fuel';
import { CHANNEL_INFO, type CanonicalChannel } from './channels';
import { detectCsvLayout, parseCsvColumns, type ColumnArray, type CsvInput } from './csv-reader';
import { mapHeaders, type HeaderMapping, type MappedColumn } from './header-mapping';
import {
  STANDARD_ATMOSPHERE_KPA,
  lambdaConversion,
  unitConversion,
  type UnitConversion,
} from './units';

export interface ReadDatalogOptions {
  fuel?: FuelSpec;
  /** Channel → header overrides (see mapHeaders). */
  map?: Readonly<Record<string, string>>;
  onProgress?: (fraction: number) => void;
}

/** A log in canonical units: what the analysis reads and what the API serves as chart data. */
export interface DatalogSeries {
  rows: number;
  /** Seconds from the first sample. */
  time: Float64Array;
  channels: Partial<Record<Exclude<CanonicalChannel, 'time'>, Float32Array>>;
  mapping: HeaderMapping;
  units: Partial<Record<CanonicalChannel, string>>;
  notes: string[];
  fuel: { spec: FuelSpec; label: string; stoichAfr: number };
}

const GASOLINE: FuelSpec = { kind: 'gasoline' };
/** Median sample step above this in an unlabelled time column means milliseconds (loggers run at 1–100 Hz). */
const MS_TIME_STEP = 5;
/** Lambda readings sit near 1; AFR readings near the stoichiometric ratio (6–15). */
const AFR_MEDIAN_ABOVE = 3;
const MEDIAN_PROBES = 2001;

function sampledMedian(values: ColumnArray): number {
  const stride = Math.max(1, Math.floor(values.length / MEDIAN_PROBES));
  const picked: number[] = [];
  for (let i = 0; i < values.length; i += stride) {
    const v = values[i] as number;
    if (Number.isFinite(v)) picked.push(v);
  }
  picked.sort((a, b) => a - b);
  return picked[Math.floor(picked.length / 2)] ?? Number.NaN;
}

function medianStep(time: Float64Array): number {
  const steps: number[] = [];
  const stride = Math.max(1, Math.floor(time.length / MEDIAN_PROBES));
  for (let i = stride; i < time.length; i += stride) {
    const step = (time[i] as number) - (time[i - 1] as number);
    if (Number.isFinite(step) && step > 0) steps.push(step);
  }
  steps.sort((a, b) => a - b);
  return steps[Math.floor(steps.length / 2)] ?? Number.NaN;
}

function conversionFor(
  channel: CanonicalChannel,
  mapped: MappedColumn,
  values: ColumnArray,
  stoich: number,
  fuel: string,
  notes: string[],
): UnitConversion {
  const info = CHANNEL_INFO[channel];
  if (info.quantity === 'lambda') {
    const unit = mapped.lambdaUnit ?? (sampledMedian(values) > AFR_MEDIAN_ABOVE ? 'afr' : 'lambda');
    if (mapped.lambdaUnit === null)
      notes.push(
        `"${mapped.header}" names no unit; its values look like ${unit === 'afr' ? 'an air-fuel ratio' : 'lambda'}.`,
      );
    if (unit === 'afr')
      notes.push(
        `"${mapped.header}" is an air-fuel ratio, turned into lambda with the ${fuel} stoichiometric ratio ${stoich.toFixed(2)}.`,
      );
    return lambdaConversion(unit, stoich);
  }
  if (info.quantity === 'count') return { unit: '', scale: 1, offset: 0 };
  const stated =
    mapped.unitText === null ? null : unitConversion(info.quantity, mapped.unitText, mapped.gauge);
  if (stated === null && mapped.unitText !== null) {
    notes.push(
      `The unit "${mapped.unitText}" of "${mapped.header}" is not known; it is read as ${info.unit}.`,
    );
  }
  if (stated === null && channel === 'time' && medianStep(values as Float64Array) > MS_TIME_STEP) {
    notes.push(
      `"${mapped.header}" names no unit and steps by more than ${MS_TIME_STEP} per sample, so it is read as milliseconds.`,
    );
    return { unit: 'ms (assumed)', scale: 0.001, offset: 0 };
  }
  const assumed = unitConversion(info.quantity, info.unit, mapped.gauge) as UnitConversion;
  const conversion = stated ?? { ...assumed, unit: `${assumed.unit} (assumed)` };
  if (conversion.offset === STANDARD_ATMOSPHERE_KPA) {
    notes.push(
      `"${mapped.header}" is read as gauge (boost) pressure; one standard atmosphere (${STANDARD_ATMOSPHERE_KPA} kPa) is added to make it absolute.`,
    );
  }
  return conversion;
}

function applyConversion(values: ColumnArray, { scale, offset }: UnitConversion): void {
  if (scale === 1 && offset === 0) return;
  for (let i = 0; i < values.length; i++) values[i] = (values[i] as number) * scale + offset;
}

/** Keeps rows that have a time value, shifting every column in place; returns the new row count. */
function dropRowsWithoutTime(time: Float64Array, others: ColumnArray[]): number {
  let kept = 0;
  for (let i = 0; i < time.length; i++) {
    if (!Number.isFinite(time[i] as number)) continue;
    if (kept !== i) {
      time[kept] = time[i] as number;
      for (const column of others) column[kept] = column[i] as number;
    }
    kept++;
  }
  return kept;
}

/** Parses a CSV datalog (bytes, or a file read in pieces) into canonical channels and units. Throws DomainError('invalid_datalog') on bad input. */
export function readDatalog(bytes: CsvInput, options: ReadDatalogOptions = {}): DatalogSeries {
  const fuelSpec = options.fuel ?? GASOLINE;
  const stoich = stoichAfr(fuelSpec);
  const label = fuelLabel(fuelSpec);
  const layout = detectCsvLayout(bytes);
  const mapping = mapHeaders(layout.headers, options.map ?? {});
  const timeColumn = mapping.channels.time;
  if (timeColumn === undefined) {
    throw new DomainError(
      'invalid_datalog',
      `No time column was found among: ${layout.headers.join(', ')}. Name it with --map time=<header>.`,
    );
  }
  const entries = Object.entries(mapping.channels) as [CanonicalChannel, MappedColumn][];
  const onProgress = options.onProgress;
  const parsed = parseCsvColumns(
    bytes,
    layout,
    entries.map(([channel, mapped]) => ({ column: mapped.column, float64: channel === 'time' })),
    onProgress ? (f) => onProgress(f * 0.9) : undefined,
  );
  if (parsed.rows === 0)
    throw new DomainError('invalid_datalog', 'The log has a header row but no data rows.');

  const notes: string[] = [];
  const units: DatalogSeries['units'] = {};
  const columns = new Map<CanonicalChannel, ColumnArray>();
  entries.forEach(([channel], i) => columns.set(channel, parsed.columns[i] as ColumnArray));
  const rawTime = columns.get('time') as Float64Array;
  columns.delete('time');
  const rows = dropRowsWithoutTime(rawTime, [...columns.values()]);
  if (rows === 0)
    throw new DomainError(
      'invalid_datalog',
      `The time column "${timeColumn.header}" holds no numbers.`,
    );
  if (rows < parsed.rows)
    notes.push(`${parsed.rows - rows} rows without a time value were left out.`);

  const time = rawTime.subarray(0, rows);
  // Clock times and date-times are seconds already, whatever the header says.
  const stamped = parsed.kinds[entries.findIndex(([channel]) => channel === 'time')] !== 'number';
  const timeUnit = stamped
    ? { unit: 's', scale: 1, offset: 0 }
    : conversionFor('time', timeColumn, time, stoich, label, notes);
  units.time = timeUnit.unit;
  const start = time[0] as number;
  for (let i = 0; i < rows; i++) time[i] = ((time[i] as number) - start) * timeUnit.scale;

  const channels: DatalogSeries['channels'] = {};
  for (const [channel, values] of columns) {
    if (channel === 'time') continue;
    const mapped = mapping.channels[channel] as MappedColumn;
    const series = values.subarray(0, rows) as Float32Array;
    const conversion = conversionFor(channel, mapped, series, stoich, label, notes);
    applyConversion(series, conversion);
    units[channel] = conversion.unit;
    channels[channel] = series;
  }

  const knock = channels.knock_retard;
  if (knock !== undefined)
    flipNegativeKnock(knock, mapping.channels.knock_retard?.header ?? '', notes);
  return {
    rows,
    time,
    channels,
    mapping,
    units,
    notes,
    fuel: { spec: fuelSpec, label, stoichAfr: stoich },
  };
}

/** Some loggers write retard as a negative correction; the report counts degrees removed as positive. */
function flipNegativeKnock(knock: Float32Array, header: string, notes: string[]): void {
  let min = Infinity;
  let max = -Infinity;
  for (const v of knock) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (max <= 0 && min < 0) {
    for (let i = 0; i < knock.length; i++) knock[i] = -(knock[i] as number);
    notes.push(
      `"${header}" logs knock retard as negative degrees; the report shows degrees removed as positive numbers.`,
    );
  }
}

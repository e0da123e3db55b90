import { DomainError } from '../errors';
import { STOICH_AFR, fuelLabel, stoichAfr, type FuelSpec } from '../vehicles/fuel';
import { CHANNEL_INFO, type CanonicalChannel } from './channels';
import { detectCsvLayout, parseCsvColumns, type ColumnArray, type CsvInput } from './csv-reader';
import { mapHeaders, type HeaderMapping, type MappedColumn } from './header-mapping';
import {
  STANDARD_ATMOSPHERE_KPA,
  lambdaConversion,
  unitConversion,
  type UnitConversion,
} from './units';

/**
 * What an AFR column is scaled to: the fuel's own stoichiometric ratio, or petrol's 14.7 (λ × 14.7), which many
 * wideband controllers print whatever the fuel.
 */
export type AfrScale = 'fuel' | 'gasoline';
export const AFR_SCALES: readonly AfrScale[] = ['fuel', 'gasoline'];

export interface ReadDatalogOptions {
  fuel?: FuelSpec;
  /** Channel → header overrides (see mapHeaders). */
  map?: Readonly<Record<string, string>>;
  /** Channel → unit text the user states ("psia", "°F", "afr"), overruling the header. */
  units?: Readonly<Record<string, string>>;
  /** Scale of every AFR column; unstated it is the fuel's, and the report checks it against cruise. */
  afrScale?: AfrScale;
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
  fuel: {
    spec: FuelSpec;
    label: string;
    stoichAfr: number;
    /** Stoichiometric ratio per sample from a logged ethanol-content channel; absent when the fuel spec decides. */
    stoichBySample?: Float32Array;
  };
  /** AFR columns turned into λ, and the scale used for them. */
  afr: { scale: AfrScale; stated: boolean; channels: CanonicalChannel[] };
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

interface LambdaContext {
  fuel: string;
  scale: AfrScale;
  /** The stoichiometric ratio the AFR is divided by (constant), or per sample. */
  stoich: number | Float32Array;
  afrChannels: CanonicalChannel[];
}

function lambdaConversionFor(
  channel: CanonicalChannel,
  mapped: MappedColumn,
  values: ColumnArray,
  lambda: LambdaContext,
  notes: string[],
): UnitConversion | { unit: string; perSample: Float32Array } {
  const unit = mapped.lambdaUnit ?? (sampledMedian(values) > AFR_MEDIAN_ABOVE ? 'afr' : 'lambda');
  if (mapped.lambdaUnit === null)
    notes.push(
      `"${mapped.header}" names no unit; its values look like ${unit === 'afr' ? 'an air-fuel ratio' : 'lambda'}.`,
    );
  if (unit === 'lambda') return lambdaConversion('lambda', 1);
  lambda.afrChannels.push(channel);
  if (lambda.scale === 'gasoline') {
    notes.push(
      `"${mapped.header}" is an air-fuel ratio on the petrol scale (λ × ${STOICH_AFR.gasoline}), turned into lambda with ${STOICH_AFR.gasoline}.`,
    );
    const c = lambdaConversion('afr', STOICH_AFR.gasoline);
    return { ...c, unit: `${c.unit}, petrol scale` };
  }
  if (typeof lambda.stoich === 'number') {
    notes.push(
      `"${mapped.header}" is an air-fuel ratio, turned into lambda with the ${lambda.fuel} stoichiometric ratio ${lambda.stoich.toFixed(2)}.`,
    );
    return lambdaConversion('afr', lambda.stoich);
  }
  notes.push(
    `"${mapped.header}" is an air-fuel ratio, turned into lambda sample by sample with the stoichiometric ratio of the logged ethanol content.`,
  );
  return { unit: 'AFR (stoich from the ethanol content)', perSample: lambda.stoich };
}

function conversionFor(
  channel: CanonicalChannel,
  mapped: MappedColumn,
  values: ColumnArray,
  notes: string[],
): UnitConversion {
  const info = CHANNEL_INFO[channel];
  if (info.quantity === 'count' || info.quantity === 'lambda') return { unit: '', scale: 1, offset: 0 };
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
  if (mapped.unitStated) conversion.unit = `${conversion.unit} (stated)`;
  return conversion;
}

/** Applies a conversion in place; gauge pressure gets the logged barometric pressure per sample where there is one. */
function applyConversion(
  values: ColumnArray,
  { scale, offset, gauge }: UnitConversion,
  baro: Float32Array | undefined,
): void {
  if (gauge === true && baro !== undefined) {
    for (let i = 0; i < values.length; i++) {
      const b = baro[i] as number;
      values[i] = (values[i] as number) * scale + (Number.isFinite(b) ? b : offset);
    }
    return;
  }
  if (scale === 1 && offset === 0) return;
  for (let i = 0; i < values.length; i++) values[i] = (values[i] as number) * scale + offset;
}

/** Plausible barometric pressure: sea level to about 5,000 m (ISO 2533 standard atmosphere, ≈ 54 kPa there) [CALC]. */
const BARO_PLAUSIBLE_KPA: readonly [number, number] = [50, 110];
/** Stoichiometric ratios by logged ethanol content, in 0.1 % steps, so a long log costs one lookup per sample. */
const ETHANOL_STEPS = 1000;
let ethanolStoichTable: Float32Array | undefined;

function stoichFromEthanol(ethanol: Float32Array, fallback: number): Float32Array {
  const table = (ethanolStoichTable ??= Float32Array.from({ length: ETHANOL_STEPS + 1 }, (_, k) =>
    stoichAfr({ kind: 'ethanol_blend', ethanolPct: (k * 100) / ETHANOL_STEPS }),
  ));
  const out = new Float32Array(ethanol.length);
  for (let i = 0; i < ethanol.length; i++) {
    const pct = ethanol[i] as number;
    out[i] =
      Number.isFinite(pct) && pct >= 0 && pct <= 100
        ? (table[Math.round((pct * ETHANOL_STEPS) / 100)] as number)
        : fallback;
  }
  return out;
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
  const mapping = mapHeaders(layout.headers, options.map ?? {}, options.units ?? {});
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
    : conversionFor('time', timeColumn, time, notes);
  units.time = timeUnit.unit;
  const start = time[0] as number;
  for (let i = 0; i < rows; i++) time[i] = ((time[i] as number) - start) * timeUnit.scale;

  const channels: DatalogSeries['channels'] = {};
  // Barometric pressure and ethanol content first: gauge pressures and AFR columns are read with them.
  const order = [...columns.keys()].sort(
    (a, b) => Number(b === 'baro' || b === 'ethanol_pct') - Number(a === 'baro' || a === 'ethanol_pct'),
  );
  let baro: Float32Array | undefined;
  const lambda: LambdaContext = {
    fuel: label,
    scale: options.afrScale ?? 'fuel',
    stoich,
    afrChannels: [],
  };
  let stoichBySample: Float32Array | undefined;
  for (const channel of order) {
    if (channel === 'time') continue;
    const mapped = mapping.channels[channel] as MappedColumn;
    const series = (columns.get(channel) as ColumnArray).subarray(0, rows) as Float32Array;
    if (CHANNEL_INFO[channel].quantity === 'lambda') {
      const conversion = lambdaConversionFor(channel, mapped, series, lambda, notes);
      if ('perSample' in conversion) {
        for (let i = 0; i < rows; i++)
          series[i] = (series[i] as number) / (conversion.perSample[i] as number);
      } else applyConversion(series, conversion, undefined);
      units[channel] = mapped.unitStated ? `${conversion.unit} (stated)` : conversion.unit;
      channels[channel] = series;
      continue;
    }
    const conversion = conversionFor(channel, mapped, series, notes);
    applyConversion(series, conversion, baro);
    if (conversion.gauge === true) {
      notes.push(
        baro === undefined
          ? `"${mapped.header}" is read as gauge (boost) pressure; one standard atmosphere (${STANDARD_ATMOSPHERE_KPA} kPa) is added to make it absolute.`
          : `"${mapped.header}" is read as gauge (boost) pressure; the logged barometric pressure is added sample by sample to make it absolute.`,
      );
    }
    units[channel] = conversion.unit;
    channels[channel] = series;
    if (channel === 'baro') baro = plausibleBaro(series, mapped.header, notes);
    if (channel === 'ethanol_pct' && fuelSpec.kind !== 'diesel') {
      stoichBySample = stoichFromEthanol(series, stoich);
      lambda.stoich = stoichBySample;
      notes.push(
        `The fuel's stoichiometric ratio is taken sample by sample from the logged ethanol content ("${mapped.header}"), by the mass-weighted blend rule.`,
      );
    }
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
    fuel: {
      spec: fuelSpec,
      label,
      stoichAfr: stoich,
      ...(stoichBySample !== undefined && { stoichBySample }),
    },
    afr: {
      scale: lambda.scale,
      stated: options.afrScale !== undefined,
      channels: lambda.afrChannels,
    },
  };
}

/** A barometric column whose readings are no air pressure (a wrong unit, a dead sensor) is not used for gauge columns. */
function plausibleBaro(
  baro: Float32Array,
  header: string,
  notes: string[],
): Float32Array | undefined {
  const median = sampledMedian(baro);
  const [lo, hi] = BARO_PLAUSIBLE_KPA;
  if (median >= lo && median <= hi) return baro;
  notes.push(
    `"${header}" reads ${Number.isFinite(median) ? `${median.toFixed(1)} kPa` : 'nothing'}, which is no barometric pressure; gauge pressures use one standard atmosphere instead.`,
  );
  return undefined;
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

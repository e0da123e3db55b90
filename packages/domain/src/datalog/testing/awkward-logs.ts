import { STOICH_AFR, stoichAfr, type FuelSpec } from '../../vehicles/fuel';
import type { AnalyzeOptions } from '../analyze';
import type { CanonicalChannel } from '../channels';
import { generateLog, type GenerateLogOptions } from './generate-log';

// Logs the way real loggers and scripts write them, each with the truth that was put in: the demo car's drive
// (generate-log.ts) rewritten with awkward names, units, encodings and damage. Demo data, not reference values.

export const AWKWARD_KINDS = [
  'snake_units',
  'camel_units',
  'dot_units',
  'header_words',
  'no_gear_channel',
  'decimal_comma',
  'cp1252_crlf',
  'bom',
  'units_row',
  'corrupt_rows',
  'gauge_with_baro',
  'absolute_psia',
  'e85_lambda',
  'e85_afr_fuel_scale',
  'e85_afr_petrol_scale',
  'petrol_car_e85_scaled_afr',
  'ethanol_channel',
  'maf_only',
  'bank_split',
  'iso_time',
  'clock_time_midnight',
] as const;
export type AwkwardKind = (typeof AWKWARD_KINDS)[number];

/** The faults put into every awkward log, to be found again by the analysis. */
export const AWKWARD_TRUTH = {
  trimErrors: [
    { rpm: [2000, 2500], map: [40, 50], trimPct: 8 },
    { rpm: [3000, 3500], map: [70, 80], trimPct: -6 },
  ] as NonNullable<GenerateLogOptions['trimErrors']>,
  /** The whole map at one trim: an airflow grid has no MAP cells to put a local fault in. */
  uniformTrimPct: 5,
  leanWot: { aboveRpm: 5000, errorPct: 6 },
  pulls: [{ gears: [2] }, { gears: [3, 4] }],
  /** Barometric pressure at about 1,600 m (ISO 2533 standard atmosphere ≈ 83.5 kPa). */
  baroKpa: 83.5,
  ethanolPct: 70,
  bank2OffsetPct: 7,
} as const;

export interface AwkwardLog {
  kind: AwkwardKind;
  bytes: Uint8Array;
  /** What the user would state for this log (the car's fuel, a known scale); the rest must be found unaided. */
  options: Pick<AnalyzeOptions, 'fuel' | 'afrScale' | 'units' | 'map' | 'trimAxis'>;
  /** The MAP cells hold these trims (empty for the airflow-only log, which carries uniformTrimPct everywhere). */
  trimErrors: NonNullable<GenerateLogOptions['trimErrors']>;
  uniformTrimPct: number | null;
  /** Distinct gears pulled. */
  gearsPulled: number;
}

type Row = Record<CanonicalChannel, number>;

// generate-log's "short" header style, metric, comma: column → channel.
const SHORT_HEADERS: Readonly<Record<string, CanonicalChannel>> = {
  Time: 'time',
  RPM: 'rpm',
  VSS: 'vehicle_speed',
  ECT: 'coolant_temp',
  IAT: 'intake_air_temp',
  MAP: 'map',
  MAF: 'maf',
  TPS: 'throttle_pos',
  APP: 'pedal_pos',
  STFT1: 'stft_b1',
  LTFT1: 'ltft_b1',
  STFT2: 'stft_b2',
  LTFT2: 'ltft_b2',
  'Lambda Target': 'lambda_cmd',
  Lambda: 'lambda_meas',
  KR: 'knock_retard',
  'Spark Adv': 'spark_advance',
  Gear: 'gear',
};

function baseRows(options: GenerateLogOptions): Row[] {
  const { text } = generateLog({
    headerStyle: 'short',
    units: 'metric',
    format: 'comma',
    gearChannel: true,
    twoBanks: true,
    seed: 11,
    ...options,
  });
  const [head = '', ...lines] = text.trimEnd().split('\n');
  const channels = head.split(',').map((h) => SHORT_HEADERS[h]);
  return lines.map((line) => {
    const row = {} as Row;
    line.split(',').forEach((cell, k) => {
      const channel = channels[k];
      if (channel !== undefined) row[channel] = Number(cell);
    });
    return row;
  });
}

interface Column {
  header: string;
  unit?: string;
  value: (row: Row, i: number) => number | string;
  digits?: number;
}

interface Layout {
  columns: Column[];
  delimiter?: string;
  decimalComma?: boolean;
  crlf?: boolean;
  bom?: boolean;
  windows1252?: boolean;
  unitsRow?: boolean;
  corrupt?: boolean;
}

// Exact definitions (NIST SP 811): psi, pound, mile, °F.
const KPA_PER_PSI = 6.894757293168361;
const G_PER_LB = 453.59237;
const KMH_PER_MPH = 1.609344;
const toF = (c: number) => (c * 9) / 5 + 32;
const lbPerMin = (gs: number) => (gs * 60) / G_PER_LB;
/** Port-injection fuel pressure of the demo car, absolute. */
const FUEL_KPA = 400;
const OIL_C = 95;

const col = (header: string, value: Column['value'], digits = 2, unit?: string): Column => ({
  header,
  value,
  digits,
  ...(unit !== undefined && { unit }),
});

/** The plain metric channels under the given headers; headers left undefined are not written. */
function plainColumns(headers: Partial<Record<CanonicalChannel, string>>): Column[] {
  const digits: Partial<Record<CanonicalChannel, number>> = { time: 3, rpm: 0, gear: 0 };
  return (Object.entries(headers) as [CanonicalChannel, string][]).map(([channel, header]) =>
    col(header, (r) => r[channel], digits[channel] ?? 3),
  );
}

const lambdaAs = (stoich: number) => (r: Row) => r.lambda_meas * stoich;
const cmdAs = (stoich: number) => (r: Row) => r.lambda_cmd * stoich;

function isoStamp(seconds: number): string {
  // 2026-03-01 23:59:00 UTC plus the log's time, written the way ISO 8601 allows: a space and no zone.
  return new Date(Date.UTC(2026, 2, 1, 23, 59, 0) + Math.round(seconds * 1000))
    .toISOString()
    .replace('T', ' ')
    .replace('Z', '');
}

function clockStamp(seconds: number): string {
  // Starts at 23:58:00 and runs past midnight.
  const ms = Math.round((23 * 3600 + 58 * 60 + seconds) * 1000) % (24 * 3600 * 1000);
  const hh = Math.floor(ms / 3600000);
  const mm = Math.floor(ms / 60000) % 60;
  const ss = (ms % 60000) / 1000;
  return `${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}:${ss.toFixed(3).padStart(6, '0')}`;
}

const OBD: Partial<Record<CanonicalChannel, string>> = {
  time: 'Time (s)',
  rpm: 'Engine RPM',
  vehicle_speed: 'Vehicle speed (km/h)',
  coolant_temp: 'Engine coolant temperature (°C)',
  intake_air_temp: 'Intake air temperature (°C)',
  map: 'Intake manifold absolute pressure (kPa)',
  maf: 'MAF air flow rate (g/s)',
  throttle_pos: 'Absolute throttle position (%)',
  pedal_pos: 'Accelerator pedal position D (%)',
  stft_b1: 'Short term fuel trim—Bank 1 (%)',
  ltft_b1: 'Long term fuel trim—Bank 1 (%)',
  lambda_cmd: 'Commanded equivalence ratio (λ)',
  lambda_meas: 'O2 sensor 1 equivalence ratio (λ)',
  knock_retard: 'Knock retard (°)',
  spark_advance: 'Timing advance (°)',
};

function layoutFor(kind: AwkwardKind, e85: number, e70: number): Layout {
  const petrol = STOICH_AFR.gasoline;
  const withOut = (drop: CanonicalChannel[]) =>
    plainColumns(
      Object.fromEntries(
        Object.entries(OBD).filter(([c]) => !drop.includes(c as CanonicalChannel)),
      ),
    );
  const obdWith = (replace: Partial<Record<CanonicalChannel, Column>>): Column[] =>
    (Object.entries(OBD) as [CanonicalChannel, string][]).map(
      ([channel, header]) => replace[channel] ?? plainColumns({ [channel]: header })[0]!,
    );
  switch (kind) {
    case 'snake_units':
      return {
        columns: [
          col('elapsed_ms', (r) => Math.round(r.time * 1000), 0),
          col('engine_rpm', (r) => r.rpm, 0),
          col('veh_spd_kph', (r) => r.vehicle_speed, 1),
          col('coolant_c', (r) => r.coolant_temp, 1),
          col('iat_c', (r) => r.intake_air_temp, 1),
          col('map_kpa', (r) => r.map, 1),
          col('airflow_lbmin', (r) => lbPerMin(r.maf), 4),
          col('tps_pct', (r) => r.throttle_pos, 1),
          col('app_pct', (r) => r.pedal_pos, 1),
          col('stft_b1_pct', (r) => r.stft_b1, 1),
          col('ltft_b1_pct', (r) => r.ltft_b1, 1),
          col('lambda_cmd', (r) => r.lambda_cmd, 3),
          col('lambda_wb', (r) => r.lambda_meas, 3),
          col('knock_retard_deg', (r) => r.knock_retard, 1),
          col('spark_adv_deg', (r) => r.spark_advance, 1),
          col('oil_temp_f', () => toF(OIL_C), 1),
          col('fuel_press_psig', () => (FUEL_KPA - 101.325) / KPA_PER_PSI, 2),
        ],
      };
    case 'camel_units':
      return {
        columns: [
          col('elapsedMs', (r) => Math.round(r.time * 1000), 0),
          col('engineRpm', (r) => r.rpm, 0),
          col('vehSpdMph', (r) => r.vehicle_speed / KMH_PER_MPH, 2),
          col('coolantF', (r) => toF(r.coolant_temp), 1),
          col('iatF', (r) => toF(r.intake_air_temp), 1),
          col('mapPsia', (r) => r.map / KPA_PER_PSI, 3),
          col('mafGs', (r) => r.maf, 2),
          col('tpsPct', (r) => r.throttle_pos, 1),
          col('appPct', (r) => r.pedal_pos, 1),
          col('stftB1Pct', (r) => r.stft_b1, 1),
          col('ltftB1Pct', (r) => r.ltft_b1, 1),
          col('lambdaCmd', (r) => r.lambda_cmd, 3),
          col('lambdaWb', (r) => r.lambda_meas, 3),
          col('knockRetardDeg', (r) => r.knock_retard, 1),
          col('sparkAdvDeg', (r) => r.spark_advance, 1),
        ],
      };
    case 'dot_units':
      return {
        columns: [
          col('time.s', (r) => r.time, 3),
          col('rpm.min', (r) => r.rpm, 0),
          col('speed.kph', (r) => r.vehicle_speed, 1),
          col('coolant.c', (r) => r.coolant_temp, 1),
          col('iat.c', (r) => r.intake_air_temp, 1),
          col('map.kpa', (r) => r.map, 1),
          col('maf.gs', (r) => r.maf, 2),
          col('tps.pct', (r) => r.throttle_pos, 1),
          col('app.pct', (r) => r.pedal_pos, 1),
          col('stft.b1.pct', (r) => r.stft_b1, 1),
          col('ltft.b1.pct', (r) => r.ltft_b1, 1),
          col('lambda.cmd', (r) => r.lambda_cmd, 3),
          col('lambda.wb', (r) => r.lambda_meas, 3),
          col('knock.deg', (r) => r.knock_retard, 1),
          col('spark.deg', (r) => r.spark_advance, 1),
        ],
      };
    case 'header_words':
      return {
        columns: [
          col('Device Time', (r) => r.time, 3),
          col('Engine Speed (rpm)', (r) => r.rpm, 0),
          col('Vehicle Speed (km/h)', (r) => r.vehicle_speed, 1),
          col('Coolant Temp (°C)', (r) => r.coolant_temp, 1),
          col('GPS Latitude', () => 47.3769, 4),
          col('Boost/Vacuum (psi)', (r) => (r.map - 101.325) / KPA_PER_PSI, 3),
          col('MAF (lb/min)', (r) => lbPerMin(r.maf), 4),
          col('Throttle Position (%)', (r) => r.throttle_pos, 1),
          col('Accelerator Pedal (%)', (r) => r.pedal_pos, 1),
          col('STFT B1 (%)', (r) => r.stft_b1, 1),
          col('LTFT B1 (%)', (r) => r.ltft_b1, 1),
          col('Lambda Target', (r) => r.lambda_cmd, 3),
          col('O2 WB', (r) => r.lambda_meas, 3),
          col('Knock Retard Cyl Avg (°)', (r) => r.knock_retard, 1),
          col('Timing (°)', (r) => r.spark_advance, 1),
          col('Battery Voltage (V)', () => 14.1, 1),
        ],
      };
    case 'no_gear_channel':
    case 'e85_lambda':
    case 'bom':
    case 'corrupt_rows':
      return { columns: withOut([]), bom: kind === 'bom', corrupt: kind === 'corrupt_rows' };
    case 'decimal_comma':
      return { columns: withOut([]), delimiter: ';', decimalComma: true };
    case 'cp1252_crlf':
      return {
        columns: obdWith({
          coolant_temp: col('Coolant Temp (°F)', (r) => toF(r.coolant_temp), 1),
          intake_air_temp: col('Intake Air Temp (°F)', (r) => toF(r.intake_air_temp), 1),
          // λ has no Windows-1252 byte.
          lambda_cmd: col('Commanded equivalence ratio', (r) => r.lambda_cmd, 3),
          lambda_meas: col('O2 sensor 1 equivalence ratio', (r) => r.lambda_meas, 3),
        }),
        windows1252: true,
        crlf: true,
      };
    case 'units_row':
      return {
        columns: [
          col('Time', (r) => r.time, 3, 's'),
          col('RPM', (r) => r.rpm, 0, 'rpm'),
          col('Speed', (r) => r.vehicle_speed / KMH_PER_MPH, 2, 'mph'),
          col('Coolant', (r) => toF(r.coolant_temp), 1, '°F'),
          col('MAP', (r) => r.map / KPA_PER_PSI, 3, 'psia'),
          col('MAF', (r) => r.maf, 2, 'g/s'),
          col('TPS', (r) => r.throttle_pos, 1, '%'),
          col('APP', (r) => r.pedal_pos, 1, '%'),
          col('STFT1', (r) => r.stft_b1, 1, '%'),
          col('LTFT1', (r) => r.ltft_b1, 1, '%'),
          col('Lambda Target', (r) => r.lambda_cmd, 3, 'λ'),
          col('Lambda', (r) => r.lambda_meas, 3, 'λ'),
          col('KR', (r) => r.knock_retard, 1, '°'),
        ],
        unitsRow: true,
      };
    case 'gauge_with_baro':
      return {
        columns: obdWith({
          map: col('MAP (psig)', (r) => (r.map - AWKWARD_TRUTH.baroKpa) / KPA_PER_PSI, 3),
        }).concat(col('Absolute barometric pressure (kPa)', () => AWKWARD_TRUTH.baroKpa, 1)),
      };
    case 'absolute_psia':
      return { columns: obdWith({ map: col('MAP (psia)', (r) => r.map / KPA_PER_PSI, 3) }) };
    case 'e85_afr_fuel_scale':
      return {
        columns: obdWith({
          lambda_cmd: col('AFR Target', cmdAs(e85), 2),
          lambda_meas: col('AFR wb', lambdaAs(e85), 2),
        }),
      };
    case 'e85_afr_petrol_scale':
      // The wideband prints λ × 14.7 on an E85 car; commanded λ is not logged, as on many add-on widebands.
      return {
        columns: withOut(['lambda_cmd', 'lambda_meas']).concat(
          col('Wideband AFR', lambdaAs(petrol), 2),
        ),
      };
    case 'petrol_car_e85_scaled_afr':
      // The reverse: a wideband left on an E85 scale (λ × 9.8) in a car logged as petrol.
      return {
        columns: withOut(['lambda_cmd', 'lambda_meas']).concat(
          col('Wideband AFR', lambdaAs(e85), 2),
        ),
      };
    case 'ethanol_channel':
      return {
        columns: obdWith({
          lambda_cmd: col('AFR Target', cmdAs(e70), 2),
          lambda_meas: col('AFR', lambdaAs(e70), 2),
        }).concat(col('Ethanol %', () => AWKWARD_TRUTH.ethanolPct, 1)),
      };
    case 'maf_only':
      return { columns: withOut(['map']) };
    case 'bank_split':
      return {
        columns: withOut([]).concat(
          col('Short term fuel trim—Bank 2 (%)', (r) => r.stft_b2, 1),
          col('Long term fuel trim—Bank 2 (%)', (r) => r.ltft_b2 + AWKWARD_TRUTH.bank2OffsetPct, 1),
        ),
      };
    case 'iso_time':
      return {
        columns: [col('Timestamp', (r) => isoStamp(r.time)), ...withOut(['time'])],
      };
    case 'clock_time_midnight':
      return {
        columns: [col('Time', (r) => clockStamp(r.time)), ...withOut(['time'])],
      };
  }
}

/** Lines a flaky logger or a hand edit leaves: a reset notice, a cut-off row, an error word, the header again. */
function corruptLine(k: number, header: string, width: number): string {
  switch (k % 4) {
    case 0:
      return '### logger reset ###';
    case 1:
      return Array.from({ length: Math.ceil(width / 3) }, (_, i) => String(i)).join(',');
    case 2:
      return Array.from({ length: width }, () => 'ERR').join(',');
    default:
      return header;
  }
}

/** Windows-1252 bytes that differ from Latin-1 (the 0x80–0x9F block); only what the OBD headers use. */
const WINDOWS_1252_EXTRA: Readonly<Record<string, number>> = { '—': 0x97 };

function encodeWindows1252(text: string): Uint8Array {
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const char = text[i] as string;
    const code = char.charCodeAt(0);
    const byte = WINDOWS_1252_EXTRA[char] ?? (code < 0x80 || (code >= 0xa0 && code <= 0xff) ? code : -1);
    if (byte < 0) throw new Error(`"${char}" has no Windows-1252 byte`);
    bytes[i] = byte;
  }
  return bytes;
}

function withBom(body: Uint8Array): Uint8Array {
  const out = new Uint8Array(body.length + 3);
  out.set([0xef, 0xbb, 0xbf]);
  out.set(body, 3);
  return out;
}

/** One awkward log of the given kind, with the truth put into it. */
export function generateAwkwardLog(kind: AwkwardKind): AwkwardLog {
  const e85 = stoichAfr({ kind: 'ethanol_blend', ethanolPct: 85 });
  const e70 = stoichAfr({ kind: 'ethanol_blend', ethanolPct: AWKWARD_TRUTH.ethanolPct });
  const uniform = kind === 'maf_only';
  const trimErrors = uniform
    ? [{ rpm: [0, 20000], map: [0, 1000], trimPct: AWKWARD_TRUTH.uniformTrimPct } as const]
    : AWKWARD_TRUTH.trimErrors;
  const rows = baseRows({
    trimErrors: trimErrors.map((e) => ({ ...e, rpm: [...e.rpm], map: [...e.map] })) as NonNullable<
      GenerateLogOptions['trimErrors']
    >,
    leanWot: AWKWARD_TRUTH.leanWot,
    pulls: AWKWARD_TRUTH.pulls.map((p) => ({ gears: [...p.gears] })),
  });
  const layout = layoutFor(kind, e85, e70);
  const delimiter = layout.delimiter ?? ',';
  const eol = layout.crlf ? '\r\n' : '\n';
  const header = layout.columns.map((c) => c.header).join(delimiter);
  const lines = [header];
  if (layout.unitsRow) lines.push(layout.columns.map((c) => c.unit ?? '').join(delimiter));
  rows.forEach((row, i) => {
    const cells = layout.columns.map((c) => {
      const v = c.value(row, i);
      const text = typeof v === 'string' ? v : v.toFixed(c.digits ?? 2);
      return layout.decimalComma ? text.replace('.', ',') : text;
    });
    lines.push(cells.join(delimiter));
    if (layout.corrupt && i > 0 && i % 997 === 0)
      lines.push(corruptLine(i / 997, header, layout.columns.length));
  });
  const text = lines.join(eol) + eol;
  const body = layout.windows1252 ? encodeWindows1252(text) : new TextEncoder().encode(text);
  const bytes = layout.bom ? withBom(body) : body;

  const fuel: FuelSpec | undefined = kind.startsWith('e85') || kind === 'ethanol_channel'
    ? { kind: 'ethanol_blend', ethanolPct: 85 }
    : undefined;
  return {
    kind,
    bytes,
    options: fuel === undefined ? {} : { fuel },
    trimErrors: uniform ? [] : AWKWARD_TRUTH.trimErrors,
    uniformTrimPct: uniform ? AWKWARD_TRUTH.uniformTrimPct : null,
    gearsPulled: new Set(AWKWARD_TRUTH.pulls.flatMap((p) => p.gears)).size,
  };
}

import { roadSpeedKmh } from '../../vehicles/drivetrain';
import { stoichAfr, type FuelSpec } from '../../vehicles/fuel';
import { parseTyreSize } from '../../vehicles/tyre';
import type { CanonicalChannel } from '../channels';
import type { DatalogVehicle } from '../context';

// A deterministic synthetic log of an invented car (2.0 L four, six-speed manual), for tests, the benchmark and
// the demo. Every number in here is demo data, not a reference value.

export const DEMO_VEHICLE: DatalogVehicle = {
  gearRatios: [3.36, 2.07, 1.46, 1.13, 0.91, 0.76],
  finalDrive: 3.94,
  tyreSize: '225/45R17',
};

export type HeaderStyle = 'obd' | 'short';
export type UnitSystem = 'metric' | 'imperial';
export type CsvFormat = 'comma' | 'semicolon_decimal_comma' | 'tab';

export interface PullSpec {
  /** Gears pulled through in order, e.g. [3] or [2, 3]. */
  gears: number[];
  pedalPct?: number;
  startRpm?: number;
  endRpm?: number;
}

export interface TrimErrorSpec {
  rpm: [number, number];
  map: [number, number];
  /** Combined short + long trim the ECU shows in that cell (ECU sign: + = adding fuel). */
  trimPct: number;
}

export interface KnockSpec {
  /** Index of the pull the burst happens in, and where in it (0–1 of its duration). */
  pull: number;
  atFraction: number;
  peakDeg: number;
}

export interface GenerateLogOptions {
  seed?: number;
  rateHz?: number;
  /** Fixed row count: the post-warm-up part repeats until it is reached (the benchmark). */
  rows?: number;
  warmupS?: number;
  cruiseS?: number;
  /** Coolant starts at 15 °C and is still cold at the first pull. */
  coldStart?: boolean;
  pulls?: PullSpec[];
  trimErrors?: TrimErrorSpec[];
  /** Measured lambda this much leaner than commanded (percent of λ) above aboveRpm during pulls. */
  leanWot?: { aboveRpm: number; errorPct: number };
  knock?: KnockSpec[];
  /** This channel sticks at its first value for the whole log. */
  deadSensor?: CanonicalChannel;
  headerStyle?: HeaderStyle;
  units?: UnitSystem;
  format?: CsvFormat;
  /** A few logger lines before the header row. */
  preamble?: boolean;
  twoBanks?: boolean;
  gearChannel?: boolean;
  fuel?: FuelSpec;
}

export interface GeneratedLog {
  text: string;
  truth: {
    durationS: number;
    pulls: { startS: number; endS: number; gears: number[] }[];
    /** Peak of each knock burst. */
    knock: { timeS: number; peakDeg: number }[];
  };
}

interface State {
  rpm: number;
  map: number;
  pedal: number;
  throttle: number;
  gear: number;
  lambdaCmd: number;
  lean: number;
  knock: number;
  phase: 'idle' | 'drive' | 'pull' | 'decel';
}

interface Segment {
  start: number;
  end: number;
  at: (t: number) => State;
}

const IDLE_RPM = 800;
const PULL_LAMBDA = 0.85;
const PULL_MAP = 98;
const SHIFT_S = 0.3;
const DECEL_S = 5;
const LEAD_IN_S = 4;
const RECOVER_S = 10;
/** A burst as fractions of its peak, with one quiet sample inside that must not split it. */
const KNOCK_SHAPE = [0.4, 0.7, 1, 0.6, 0, 0.3, 0.2];
const KNOCK_PEAK_INDEX = 2;

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const base = (rpm: number, map: number, gear: number, phase: State['phase']): State => {
  const pedal = phase === 'idle' ? 0 : 5 + (map - 25) * 0.4;
  return {
    rpm,
    map,
    pedal,
    throttle: phase === 'idle' ? 3 : pedal * 0.9,
    gear,
    lambdaCmd: 1,
    lean: 0,
    knock: 0,
    phase,
  };
};

/** Part-throttle driving that sweeps rpm 1100–3900 × MAP 27–93 kPa so every trim cell gets samples. */
const drive = (t: number): State =>
  base(
    2500 + 1400 * Math.sin((2 * Math.PI * t) / 53),
    60 + 33 * Math.sin((2 * Math.PI * t) / 23 + 1),
    4,
    'drive',
  );

function buildTimeline(
  o: Required<Pick<GenerateLogOptions, 'warmupS' | 'cruiseS' | 'pulls'>> & GenerateLogOptions,
  rate: number,
) {
  const segments: Segment[] = [];
  const truthPulls: GeneratedLog['truth']['pulls'] = [];
  const knockTimes: GeneratedLog['truth']['knock'] = [];
  const ratios = DEMO_VEHICLE.gearRatios;
  let t = 0;
  const add = (duration: number, at: (local: number) => State) => {
    const start = t;
    segments.push({ start, end: start + duration, at: (time) => at(time - start) });
    t += duration;
  };
  add(60, () => base(IDLE_RPM, 32, 0, 'idle'));
  add(o.warmupS - 60, (l) => ({ ...drive(l), rpm: 1800 + 400 * Math.sin(l / 9), gear: 3 }));
  const cycleStart = t;
  add(o.cruiseS, drive);
  o.pulls.forEach((pull, index) => {
    const pedal = pull.pedalPct ?? 100;
    const startRpm = pull.startRpm ?? 2500;
    const endRpm = pull.endRpm ?? 6500;
    const first = pull.gears[0] ?? 3;
    add(LEAD_IN_S, () => ({ ...base(startRpm, 45, first, 'drive'), pedal: 20, throttle: 18 }));
    const pullStart = t;
    // Time per gear at the rpm rise rate of that gear (a lower gear revs faster), scaled by how hard the pedal is pressed.
    const legs = pull.gears.map((gear, k) => {
      const ratio = ratios[gear - 1] ?? 1;
      const from =
        k === 0 ? startRpm : (endRpm * ratio) / (ratios[(pull.gears[k - 1] ?? gear) - 1] ?? ratio);
      const rate = 650 * ratio * (pedal / 100) ** 1.5;
      return {
        gear,
        from,
        duration: (endRpm - from) / rate + (k < pull.gears.length - 1 ? SHIFT_S : 0),
      };
    });
    const total = legs.reduce((s, l) => s + l.duration, 0);
    add(total, (l) => {
      let local = l;
      let leg = legs[0] ?? { gear: first, from: startRpm, duration: total };
      for (const candidate of legs) {
        leg = candidate;
        if (local < candidate.duration) break;
        local -= candidate.duration;
      }
      const climb = leg.duration - (legs.indexOf(leg) < legs.length - 1 ? SHIFT_S : 0);
      const rpm = leg.from + ((endRpm - leg.from) * Math.min(local, climb)) / climb;
      const partial = pedal < 90;
      return {
        rpm,
        map: partial ? 30 + pedal * 0.6 : PULL_MAP,
        pedal,
        throttle: pedal,
        gear: leg.gear,
        lambdaCmd: partial ? 1 : 1 - (1 - PULL_LAMBDA) * Math.min(1, l / 0.2),
        lean: o.leanWot && rpm >= o.leanWot.aboveRpm ? o.leanWot.errorPct / 100 : 0,
        knock: 0,
        phase: 'pull',
      };
    });
    truthPulls.push({ startS: pullStart, endS: t, gears: [...pull.gears] });
    for (const k of o.knock ?? []) {
      if (k.pull !== index) continue;
      const burstStart = Math.round((pullStart + total * k.atFraction) * rate) / rate;
      const at = segments.at(-1)?.at;
      if (at === undefined) continue;
      const shape = KNOCK_SHAPE.map((v) => v * k.peakDeg);
      segments[segments.length - 1] = {
        start: pullStart,
        end: t,
        at: (time) => {
          const state = at(time);
          const sample = Math.round((time - burstStart) * rate);
          return sample >= 0 && sample < shape.length
            ? { ...state, knock: shape[sample] ?? 0 }
            : state;
        },
      };
      knockTimes.push({ timeS: burstStart + KNOCK_PEAK_INDEX / rate, peakDeg: k.peakDeg });
    }
    const lastGear = pull.gears.at(-1) ?? first;
    add(DECEL_S, (l) => ({
      ...base(endRpm - ((endRpm - 1400) * l) / DECEL_S, 22, lastGear, 'decel'),
      pedal: 0,
      throttle: 0,
    }));
    add(RECOVER_S, (l) => ({ ...drive(l), rpm: 1400 + 100 * l, gear: lastGear }));
  });
  const cycleEnd = t;
  add(10, () => base(IDLE_RPM, 32, 0, 'idle'));
  return { segments, cycleStart, cycleEnd, truthPulls, knockTimes, duration: t };
}

interface Column {
  channel: CanonicalChannel;
  header: string;
  value: (s: Sample) => number;
  digits: number;
}

interface Sample extends State {
  time: number;
  speed: number;
  coolant: number;
  iat: number;
  maf: number;
  stft1: number;
  ltft1: number;
  stft2: number;
  ltft2: number;
  lambdaMeas: number;
  spark: number;
}

const KMH_PER_MPH = 1.609344;
const KPA_PER_PSI = 6.894757293168361;
const G_PER_LB = 453.59237;
const toF = (c: number) => (c * 9) / 5 + 32;

function columnsFor(o: GenerateLogOptions, stoich: number): Column[] {
  const obd = (o.headerStyle ?? 'obd') === 'obd';
  const imperial = o.units === 'imperial';
  const col = (
    channel: CanonicalChannel,
    header: string,
    value: (s: Sample) => number,
    digits: number,
  ): Column => ({ channel, header, value, digits });
  const trims = (bank: 1 | 2): Column[] => {
    const st = (s: Sample) => (bank === 1 ? s.stft1 : s.stft2);
    const lt = (s: Sample) => (bank === 1 ? s.ltft1 : s.ltft2);
    return obd
      ? [
          col(
            `stft_b${bank}`,
            imperial ? `STFT B${bank} (%)` : `Short term fuel trim—Bank ${bank} (%)`,
            st,
            1,
          ),
          col(
            `ltft_b${bank}`,
            imperial ? `LTFT B${bank} (%)` : `Long term fuel trim—Bank ${bank} (%)`,
            lt,
            1,
          ),
        ]
      : [
          col(`stft_b${bank}`, imperial ? `STFT${bank} %` : `STFT${bank}`, st, 1),
          col(`ltft_b${bank}`, imperial ? `LTFT${bank} %` : `LTFT${bank}`, lt, 1),
        ];
  };
  const columns: Column[] = [
    imperial
      ? col('time', obd ? 'Time (ms)' : 'Time ms', (s) => Math.round(s.time * 1000), 0)
      : col('time', obd ? 'Time (s)' : 'Time', (s) => s.time, 3),
    col(
      'rpm',
      obd ? (imperial ? 'Engine Speed (rpm)' : 'Engine RPM (rpm)') : 'RPM',
      (s) => s.rpm,
      0,
    ),
    imperial
      ? col(
          'vehicle_speed',
          obd ? 'Vehicle Speed (mph)' : 'VSS mph',
          (s) => s.speed / KMH_PER_MPH,
          1,
        )
      : col('vehicle_speed', obd ? 'Vehicle speed (km/h)' : 'VSS', (s) => s.speed, 1),
    imperial
      ? col('coolant_temp', obd ? 'Coolant Temp [°F]' : 'ECT °F', (s) => toF(s.coolant), 1)
      : col('coolant_temp', obd ? 'Engine coolant temperature (°C)' : 'ECT', (s) => s.coolant, 1),
    imperial
      ? col('intake_air_temp', obd ? 'Intake Air Temp [°F]' : 'IAT °F', (s) => toF(s.iat), 1)
      : col('intake_air_temp', obd ? 'Intake air temperature (°C)' : 'IAT', (s) => s.iat, 1),
    imperial
      ? obd
        ? col('map', 'Boost psi', (s) => (s.map - 101.325) / KPA_PER_PSI, 2)
        : col('map', 'MAP psi', (s) => s.map / KPA_PER_PSI, 2)
      : col('map', obd ? 'Intake manifold absolute pressure (kPa)' : 'MAP', (s) => s.map, 1),
    imperial
      ? col('maf', obd ? 'MAF (lb/min)' : 'MAF lb/min', (s) => (s.maf * 60) / G_PER_LB, 3)
      : col('maf', obd ? 'MAF air flow rate (g/s)' : 'MAF', (s) => s.maf, 2),
    col('throttle_pos', obd ? 'Absolute throttle position (%)' : 'TPS', (s) => s.throttle, 1),
    col('pedal_pos', obd ? 'Accelerator pedal position D (%)' : 'APP', (s) => s.pedal, 1),
    ...trims(1),
    ...(o.twoBanks ? trims(2) : []),
    imperial
      ? col('lambda_cmd', 'AFR Target', (s) => s.lambdaCmd * stoich, 2)
      : col(
          'lambda_cmd',
          obd ? 'Commanded equivalence ratio (λ)' : 'Lambda Target',
          (s) => s.lambdaCmd,
          3,
        ),
    imperial
      ? col('lambda_meas', 'AFR', (s) => s.lambdaMeas * stoich, 2)
      : col(
          'lambda_meas',
          obd ? 'O2 sensor 1 equivalence ratio (λ)' : 'Lambda',
          (s) => s.lambdaMeas,
          3,
        ),
    col('knock_retard', obd ? 'Knock retard (°)' : 'KR', (s) => s.knock, 1),
    col('spark_advance', obd ? 'Timing advance (°)' : 'Spark Adv', (s) => s.spark, 1),
  ];
  if (o.gearChannel) columns.push(col('gear', 'Gear', (s) => s.gear, 0));
  return columns;
}

/** Yields the log as text chunks of about `rowsPerChunk` rows, so a million-row log never sits in one string. */
export function* generateLogChunks(
  options: GenerateLogOptions = {},
  rowsPerChunk = 20000,
): Generator<string, GeneratedLog['truth']> {
  const rate = options.rateHz ?? 20;
  const o = { warmupS: 360, cruiseS: 600, pulls: [{ gears: [3] }], ...options };
  const timeline = buildTimeline(o, rate);
  const stoich = stoichAfr(options.fuel ?? { kind: 'gasoline' });
  const columns = columnsFor(o, stoich);
  const format = o.format ?? 'comma';
  const delimiter = format === 'comma' ? ',' : format === 'tab' ? '\t' : ';';
  const decimalComma = format === 'semicolon_decimal_comma';
  const quote = (h: string) => (decimalComma ? `"${h}"` : h);
  const random = mulberry32(o.seed ?? 1);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const circumferenceM = parseTyreSize(DEMO_VEHICLE.tyreSize).circumferenceMm;
  const rows = o.rows ?? Math.floor(timeline.duration * rate);

  let chunk = o.preamble
    ? ['Logger export', `Vehicle${delimiter}demo car`, 'Sample rate: ' + rate + ' Hz', ''].join(
        '\n',
      ) + '\n'
    : '';
  chunk += columns.map((c) => quote(c.header)).join(delimiter) + '\n';
  let segment = 0;
  let dead: number | undefined;
  let ltft1 = 0;
  let ltft2 = 0;
  for (let i = 0; i < rows; i++) {
    const time = i / rate;
    const cycle = timeline.cycleEnd - timeline.cycleStart;
    const local =
      o.rows !== undefined && time >= timeline.cycleEnd
        ? timeline.cycleStart + ((time - timeline.cycleStart) % cycle)
        : time;
    if (local < (timeline.segments[segment]?.start ?? 0)) segment = 0;
    while (
      segment < timeline.segments.length - 1 &&
      local >= (timeline.segments[segment]?.end ?? Infinity)
    )
      segment++;
    const state = (timeline.segments[segment] as Segment).at(local);
    const rpm = Math.max(0, state.rpm + (state.phase === 'idle' ? 15 * gauss() : 0));
    const coolant = o.coldStart
      ? 15 + 45 * (1 - Math.exp(-time / 600))
      : 90 - 50 * Math.exp(-time / 90) + 1.5 * Math.sin(time / 40);
    const iat = 30 + 5 * Math.sin(time / 200);
    const ratio = DEMO_VEHICLE.gearRatios[state.gear - 1];
    const speed =
      ratio === undefined ? 0 : roadSpeedKmh(rpm, ratio, DEMO_VEHICLE.finalDrive, circumferenceM);
    // Speed density: ṁ = p/(R·T) · Vd · VE · rpm/120 with Vd 2.0 L and VE 0.85.
    const maf =
      ((state.map * 1000) / (287.05 * (iat + 273.15))) * 0.002 * 0.85 * (rpm / 120) * 1000;
    const closedLoop = state.phase !== 'pull' && state.phase !== 'decel' && coolant >= 40;
    const injected =
      o.trimErrors?.find(
        (e) => rpm >= e.rpm[0] && rpm < e.rpm[1] && state.map >= e.map[0] && state.map < e.map[1],
      )?.trimPct ?? 0;
    let stft1 = 0;
    let stft2 = 0;
    if (closedLoop) {
      ltft1 = 0.75 * injected;
      ltft2 = 0.75 * injected;
      stft1 = injected - ltft1 + 1.2 * gauss();
      stft2 = injected - ltft2 + 1.2 * gauss();
    }
    const fuelCut = state.phase === 'decel';
    const lambdaMeas = fuelCut
      ? 1.6 + 0.2 * random()
      : state.lambdaCmd * (1 + state.lean) + 0.003 * gauss();
    const sample: Sample = {
      ...state,
      rpm,
      time,
      speed,
      coolant,
      iat,
      maf,
      stft1,
      ltft1,
      stft2,
      ltft2,
      lambdaMeas,
      spark: 12 + rpm / 400 - (100 - state.map) / 10 - state.knock,
    };
    const cells = columns.map((c) => {
      let v = c.value(sample);
      if (c.channel === o.deadSensor) v = dead ??= v;
      return v.toFixed(c.digits);
    });
    const line = cells.join(delimiter);
    chunk += (decimalComma ? line.replaceAll('.', ',') : line) + '\n';
    if ((i + 1) % rowsPerChunk === 0) {
      yield chunk;
      chunk = '';
    }
  }
  if (chunk !== '') yield chunk;
  return { durationS: (rows - 1) / rate, pulls: timeline.truthPulls, knock: timeline.knockTimes };
}

export function generateLog(options: GenerateLogOptions = {}): GeneratedLog {
  const chunks = generateLogChunks(options);
  let text = '';
  for (;;) {
    const next = chunks.next();
    if (next.done) return { text, truth: next.value };
    text += next.value;
  }
}

/** A short drive for tests: warm-up past five minutes, one full-throttle pull in third gear with a knock burst in it. */
export const KNOCKING_DRIVE: Readonly<GenerateLogOptions> = {
  rateHz: 10,
  warmupS: 320,
  cruiseS: 90,
  pulls: [{ gears: [3] }],
  knock: [{ pull: 0, atFraction: 0.5, peakDeg: 4 }],
  gearChannel: true,
};

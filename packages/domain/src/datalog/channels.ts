/** Canonical channels of a datalog, in the units the analysis works in (DESIGN "Datalog report contract"). */
export const CANONICAL_CHANNELS = [
  'time',
  'rpm',
  'vehicle_speed',
  'coolant_temp',
  'intake_air_temp',
  'map',
  'maf',
  'throttle_pos',
  'pedal_pos',
  'engine_load',
  'stft_b1',
  'ltft_b1',
  'stft_b2',
  'ltft_b2',
  'lambda_cmd',
  'lambda_meas',
  'knock_retard',
  'spark_advance',
  'gear',
  'baro',
  'ethanol_pct',
  'oil_temp',
  'fuel_pressure',
] as const;

export type CanonicalChannel = (typeof CANONICAL_CHANNELS)[number];

/** `--map afr_meas=…` names an AFR column; it lands on the lambda channel, converted with the fuel's stoichiometric ratio. */
export const CHANNEL_ALIASES: Readonly<Record<string, CanonicalChannel>> = {
  afr_cmd: 'lambda_cmd',
  afr_meas: 'lambda_meas',
};

export type Quantity =
  | 'time'
  | 'rotational_speed'
  | 'speed'
  | 'temperature'
  | 'pressure'
  | 'mass_flow'
  | 'percent'
  | 'lambda'
  | 'angle'
  | 'count';

export interface ChannelInfo {
  quantity: Quantity;
  /** Canonical unit label. */
  unit: string;
  /** Plain name for messages a customer reads. */
  label: string;
}

export const CHANNEL_INFO: Readonly<Record<CanonicalChannel, ChannelInfo>> = {
  time: { quantity: 'time', unit: 's', label: 'time' },
  rpm: { quantity: 'rotational_speed', unit: 'rpm', label: 'engine speed' },
  vehicle_speed: { quantity: 'speed', unit: 'km/h', label: 'vehicle speed' },
  coolant_temp: { quantity: 'temperature', unit: '°C', label: 'coolant temperature' },
  intake_air_temp: { quantity: 'temperature', unit: '°C', label: 'intake air temperature' },
  map: { quantity: 'pressure', unit: 'kPa', label: 'manifold pressure' },
  maf: { quantity: 'mass_flow', unit: 'g/s', label: 'mass air flow' },
  throttle_pos: { quantity: 'percent', unit: '%', label: 'throttle position' },
  pedal_pos: { quantity: 'percent', unit: '%', label: 'accelerator pedal position' },
  engine_load: { quantity: 'percent', unit: '%', label: 'calculated engine load' },
  stft_b1: { quantity: 'percent', unit: '%', label: 'short-term fuel trim, bank 1' },
  ltft_b1: { quantity: 'percent', unit: '%', label: 'long-term fuel trim, bank 1' },
  stft_b2: { quantity: 'percent', unit: '%', label: 'short-term fuel trim, bank 2' },
  ltft_b2: { quantity: 'percent', unit: '%', label: 'long-term fuel trim, bank 2' },
  lambda_cmd: { quantity: 'lambda', unit: 'λ', label: 'commanded lambda (air-fuel ratio)' },
  lambda_meas: {
    quantity: 'lambda',
    unit: 'λ',
    label: 'measured lambda (wideband air-fuel ratio)',
  },
  knock_retard: { quantity: 'angle', unit: '°', label: 'knock retard' },
  spark_advance: { quantity: 'angle', unit: '°', label: 'spark advance' },
  gear: { quantity: 'count', unit: '', label: 'gear' },
  baro: { quantity: 'pressure', unit: 'kPa', label: 'barometric pressure' },
  ethanol_pct: { quantity: 'percent', unit: '%', label: 'ethanol content of the fuel' },
  oil_temp: { quantity: 'temperature', unit: '°C', label: 'oil temperature' },
  fuel_pressure: { quantity: 'pressure', unit: 'kPa', label: 'fuel pressure (absolute)' },
};

// Patterns run against the normalised header name (see normaliseHeaderName): lowercase words, letters and digits
// split ("STFT1" → "stft 1"), units removed. Order within a channel is preference: the first pattern that
// matches any column wins, so "Accelerator pedal position D" beats "…E". OBD-II names follow SAE J1979 PID titles.
const BANK1 = '(?: (?:bank|b) 1| 1)?';
const BANK2 = ' (?:bank|b) 2| 2';

export const CHANNEL_SYNONYMS: Readonly<Record<CanonicalChannel, readonly RegExp[]>> = {
  time: [
    /^(?:time|timestamp|time stamp|elapsed time|log time|elapsed|seconds|sec|secs|t|offset|ms)$/,
    /^(?:device|logger|session|sample|record|run) time$/,
  ],
  rpm: [/^(?:engine |eng )?(?:rpm|revs)$/, /^(?:eng|engine) (?:spd|speed)$/, /^tach(?:ometer)?$/],
  vehicle_speed: [
    /^(?:vehicle|veh|road|ground|car) (?:speed|spd)$/,
    /^(?:vss|speed|kph|mph|gps speed|wheel speed)$/,
  ],
  coolant_temp: [
    /^(?:engine )?coolant(?: temp| temperature| temp sensor)?$/,
    /^(?:ect|clt|cts|water temp|water temperature|coolant temp)$/,
  ],
  intake_air_temp: [
    /^intake air temp(?:erature)?(?: sensor)?(?: 1| bank 1 sensor 1)?$/,
    /^(?:iat|intake temp|air temp|charge air temp|manifold air temp|mat|act|inlet air temp)$/,
  ],
  map: [
    /^(?:intake )?manifold (?:absolute )?pressure$/,
    /^(?:map|boost|boost pressure|manifold pressure|map sensor|intake pressure)$/,
    /^(?:boost vacuum|boost vac|vacuum boost|boost and vacuum|manifold boost|map abs|manifold abs pressure)$/,
  ],
  maf: [
    /^(?:maf|maf air flow rate|maf air flow|maf rate|mass air ?flow(?: rate)?|air ?flow(?: rate)?|mass airflow|air mass|air mass flow)$/,
  ],
  throttle_pos: [
    /^(?:absolute )?throttle(?: position| pos| angle| plate| opening)?(?: a| sensor)?$/,
    /^(?:tps|tp|throttle)$/,
    /^relative throttle position$/,
  ],
  pedal_pos: [
    /^(?:accelerator )?pedal(?: position| pos)?(?: d)?$/,
    /^(?:app|app d|accel pedal|accelerator|accel pos|accelerator position)$/,
    /^accelerator pedal position [ef]$/,
    /^relative accelerator pedal position$/,
  ],
  engine_load: [
    /^(?:calculated )?(?:engine )?load(?: value)?$/,
    /^(?:calc load|load pct|eng load)$/,
  ],
  stft_b1: [
    new RegExp(
      `^(?:short term fuel trim|stft|short term ft|st ft|st fuel trim|st trim|sft|fuel trim short term)${BANK1}$`,
    ),
  ],
  ltft_b1: [
    new RegExp(
      `^(?:long term fuel trim|ltft|long term ft|lt ft|lt fuel trim|lt trim|lft|fuel trim long term)${BANK1}$`,
    ),
  ],
  stft_b2: [
    new RegExp(
      `^(?:short term fuel trim|stft|short term ft|st ft|st fuel trim|st trim|sft|fuel trim short term)(?:${BANK2})$`,
    ),
  ],
  ltft_b2: [
    new RegExp(
      `^(?:long term fuel trim|ltft|long term ft|lt ft|lt fuel trim|lt trim|lft|fuel trim long term)(?:${BANK2})$`,
    ),
  ],
  lambda_cmd: [
    /^commanded (?:equivalence ratio|lambda|afr|air fuel ratio|a f ratio|eq ratio)$/,
    /^(?:lambda|afr|air fuel ratio|eq ratio|equivalence ratio) (?:target|tgt|cmd|command|commanded|desired|request|requested|des)$/,
    /^(?:target|desired|requested|cmd) (?:lambda|afr|air fuel ratio)$/,
  ],
  lambda_meas: [
    /^(?:lambda|afr|air fuel ratio|a f ratio|equivalence ratio)(?: (?:meas|measured|actual|act|sensor|bank 1|b 1|1|b 1 s 1|wideband))?$/,
    /^(?:measured|actual) (?:lambda|afr|air fuel ratio)$/,
    /^(?:wideband|wb)(?: (?:lambda|afr|o 2|o 2 sensor|sensor))?$/,
    // Wideband controllers' own names: "AFR wb", "Lambda wideband", "O2 WB", "Lambda Sensor 1".
    /^(?:lambda|afr|air fuel ratio|o 2|o 2 sensor|oxygen sensor)(?: 1)? (?:wb|wideband|wide band|uego)(?: 1)?$/,
    /^(?:wb|wideband|uego) (?:lambda|afr|o 2)(?: 1)?$/,
    /^(?:lambda|afr) sensor(?: 1)?$/,
    /^(?:o 2|oxygen) sensor (?:1 |bank 1 sensor 1 |b 1 s 1 |s 1 )?(?:wide range )?(?:equivalence ratio|lambda|air fuel ratio|afr)$/,
    /^wide range (?:o 2|oxygen) sensor (?:1 )?(?:lambda|equivalence ratio)$/,
  ],
  knock_retard: [
    /^(?:knock|kr|knock retard|knock ret|knock correction|knock corr|timing retard|ignition retard|spark retard|knock retard total)$/,
    /^(?:knock retard|knock ret|kr|knock correction|ignition retard|timing retard)(?: cyl| cylinder)? (?:avg|average|mean|max|total)$/,
  ],
  spark_advance: [
    /^(?:timing advance|ignition timing|spark advance|ignition advance|spark timing|timing|spark|ign timing|ign adv|spark adv|ignition angle)$/,
  ],
  gear: [
    /^(?:gear|current gear|gear position|trans gear|transmission gear|gear engaged|selected gear|gear actual)$/,
  ],
  // SAE J1979 PID 0x33 "Absolute barometric pressure".
  baro: [
    /^(?:absolute )?(?:barometric|baro|atmospheric|ambient|ambient air) (?:pressure|press)$/,
    /^(?:baro|bap|barometer|atm pressure)$/,
  ],
  ethanol_pct: [
    /^(?:ethanol|ethanol content|ethanol percent|ethanol pct|eth|e|flex fuel|flex fuel content|flex fuel sensor|flex fuel ethanol|fuel ethanol|fuel ethanol content|alcohol fuel|alcohol content|ethanol fuel)$/,
  ],
  oil_temp: [/^(?:engine )?oil (?:temp|temperature)$/, /^(?:eot|oil t)$/],
  fuel_pressure: [
    /^(?:fuel (?:rail )?(?:press|pressure)|fuel rail pressure|frp|fp|fuel press)$/,
  ],
};

export const isCanonicalChannel = (name: string): name is CanonicalChannel =>
  (CANONICAL_CHANNELS as readonly string[]).includes(name);

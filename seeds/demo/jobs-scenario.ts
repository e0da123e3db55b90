import { findJob, findMembershipOfUser, findShopById, findUserById, insertJob, insertPackage, insertVehicle, newId, updateJob, updateShop, type CalibrationModule, type Db } from '@revloop/db';
import { defineAbilityFor } from '@revloop/domain/auth';
import { defaultLogRequest, type LogRequest } from '@revloop/domain/datalog';
import type { JobState } from '@revloop/domain/jobs';
import { vinCheckDigit, type VehicleInput } from '@revloop/domain/vehicles';
import { buildActor, moveJob, postJobMessage, recordAudit, setJobFacts, takeJob, type DiskBlobStore, type JobFlowDeps, type ShopAuth } from '@revloop/api';
import { DemoFiles } from './files-scenario';
import { storeDemoLog, type DriveKind } from './logs-scenario';
import type { SeededShop } from './seed-demo';

/** Invented vehicles, described generically; VINs are made up with a valid check digit. */
const VEHICLES: Array<Omit<VehicleInput, 'vin' | 'vinCheckDigitOverride'> & { vinStem: string }> = [
  {
    vinStem: '1RL4H5DA?LK',
    modelYear: 2020,
    description: 'Compact hatchback, 2.0 turbo I4, 6-speed manual',
    engine: { displacementL: 2.0, cylinders: 4, aspiration: 'turbocharged', family: '2.0 turbo I4' },
    transmission: { type: 'manual', gearRatios: [3.36, 2.09, 1.47, 1.1, 0.87, 0.71] },
    finalDrive: 3.47,
    tyreSize: '235/35R19',
    curbMassKg: 1420,
    fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 93 }, ethanolPct: 10 },
    modifications: { parts: ['intake', 'downpipe', 'intercooler'], notes: 'Aftermarket downpipe with high-flow catalyst.' },
    revLimitRpm: 6800,
  },
  {
    vinStem: '2RL7V8EB?MK',
    modelYear: 2021,
    description: 'Full-size pickup, 5.3 V8, 10-speed automatic',
    engine: { displacementL: 5.3, cylinders: 8, aspiration: 'naturally_aspirated', family: 'V8' },
    transmission: { type: 'automatic', gearRatios: [4.7, 2.99, 2.15, 1.8, 1.52, 1.28, 1.0, 0.85, 0.69, 0.64] },
    finalDrive: 3.23,
    tyreSize: '275/60R20',
    curbMassKg: 2290,
    fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 91 }, ethanolPct: 10 },
    modifications: { parts: ['intake', 'exhaust'], notes: 'Larger tyres fitted; speedometer correction wanted.' },
    revLimitRpm: 6000,
  },
  {
    vinStem: '3RL2C6FC?NK',
    modelYear: 2018,
    description: 'Rear-drive sports coupe, 3.0 twin-turbo I6, 8-speed automatic',
    engine: { displacementL: 3.0, cylinders: 6, aspiration: 'turbocharged', family: '3.0 turbo I6' },
    transmission: { type: 'automatic', gearRatios: [5.0, 3.2, 2.14, 1.72, 1.31, 1.0, 0.82, 0.64] },
    finalDrive: 3.15,
    tyreSize: '255/35R19',
    curbMassKg: 1610,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 98 }, ethanolPct: 0 },
    modifications: { parts: ['downpipe', 'charge_pipes', 'flex_fuel_sensor'], notes: '' },
    revLimitRpm: 7000,
  },
  {
    vinStem: '4RL9K2GD?PK',
    modelYear: 2016,
    description: 'Mid-size sedan, 2.5 naturally aspirated I4, 6-speed manual',
    engine: { displacementL: 2.5, cylinders: 4, aspiration: 'naturally_aspirated', family: '2.5 NA I4' },
    transmission: { type: 'manual', gearRatios: [3.45, 1.95, 1.37, 1.03, 0.8, 0.67] },
    finalDrive: 4.1,
    tyreSize: '225/45R18',
    curbMassKg: 1450,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 95 }, ethanolPct: 0 },
    modifications: { parts: ['headers', 'exhaust', 'camshafts'], notes: 'Mild cams; idle quality matters to the owner.' },
    revLimitRpm: 7200,
  },
  {
    vinStem: '5RL3M4HE?RK',
    modelYear: 2022,
    description: 'Compact SUV, 1.5 turbo I3, 7-speed dual-clutch',
    engine: { displacementL: 1.5, cylinders: 3, aspiration: 'turbocharged', family: '1.5 turbo I3' },
    transmission: { type: 'dct', gearRatios: [3.5, 2.1, 1.32, 0.96, 0.95, 0.8, 0.68] },
    finalDrive: 4.05,
    tyreSize: '215/55R17',
    curbMassKg: 1390,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 95 }, ethanolPct: 5 },
    modifications: { parts: [], notes: 'Stock car, economy and response wanted.' },
    revLimitRpm: 6300,
  },
  {
    vinStem: '6RL8D1JF?SK',
    modelYear: 2019,
    description: 'Roadster, 2.0 supercharged I4, 6-speed manual',
    engine: { displacementL: 2.0, cylinders: 4, aspiration: 'supercharged', family: '2.0 supercharged I4' },
    transmission: { type: 'manual', gearRatios: [3.76, 2.27, 1.65, 1.19, 1.0, 0.84] },
    finalDrive: 3.9,
    tyreSize: '205/45R17',
    curbMassKg: 1090,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 98 }, ethanolPct: 0 },
    modifications: { parts: ['supercharger', 'injectors', 'fuel_pump'], notes: 'Track days; E85 later.' },
    revLimitRpm: 7500,
  },
  {
    vinStem: '1RL6P2KG?LK',
    modelYear: 2020,
    description: 'Muscle coupe, 6.2 V8, 6-speed manual',
    engine: { displacementL: 6.2, cylinders: 8, aspiration: 'naturally_aspirated', family: 'V8' },
    transmission: { type: 'manual', gearRatios: [2.66, 1.78, 1.3, 1.0, 0.74, 0.5] },
    finalDrive: 3.73,
    tyreSize: '285/35R20',
    curbMassKg: 1700,
    fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 93 }, ethanolPct: 10 },
    modifications: { parts: ['headers', 'intake', 'exhaust'], notes: 'Long-tube headers; wants the torque management eased.' },
    revLimitRpm: 6500,
  },
  {
    vinStem: '2RL5S7LH?MK',
    modelYear: 2021,
    description: 'All-wheel-drive sport sedan, 2.0 turbo I4, 8-speed automatic',
    engine: { displacementL: 2.0, cylinders: 4, aspiration: 'turbocharged', family: '2.0 turbo I4' },
    transmission: { type: 'automatic', gearRatios: [4.71, 3.14, 2.11, 1.67, 1.29, 1.0, 0.84, 0.67] },
    finalDrive: 3.2,
    tyreSize: '245/40R18',
    curbMassKg: 1640,
    fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 93 }, ethanolPct: 10 },
    modifications: { parts: ['intake', 'intercooler'], notes: '' },
    revLimitRpm: 6500,
  },
  {
    vinStem: '3RL8T3MJ?NK',
    modelYear: 2022,
    description: 'Mid-size pickup, 3.5 twin-turbo V6, 10-speed automatic',
    engine: { displacementL: 3.5, cylinders: 6, aspiration: 'turbocharged', family: 'V6 twin-turbo' },
    transmission: { type: 'automatic', gearRatios: [4.7, 2.99, 2.15, 1.8, 1.52, 1.28, 1.0, 0.85, 0.69, 0.64] },
    finalDrive: 3.55,
    tyreSize: '265/70R17',
    curbMassKg: 2200,
    fuel: { type: 'gasoline', octane: { scale: 'AKI', rating: 91 }, ethanolPct: 10 },
    modifications: { parts: ['intake'], notes: 'Tows a camper most weekends.' },
    revLimitRpm: 6000,
  },
  {
    vinStem: '4RL1W9NK?PK',
    modelYear: 2017,
    description: 'All-wheel-drive wagon, 2.5 turbo flat-4, 6-speed manual',
    engine: { displacementL: 2.5, cylinders: 4, aspiration: 'turbocharged', family: '2.5 turbo flat-4' },
    transmission: { type: 'manual', gearRatios: [3.64, 2.24, 1.52, 1.14, 0.97, 0.76] },
    finalDrive: 3.9,
    tyreSize: '225/45R18',
    curbMassKg: 1540,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 98 }, ethanolPct: 0 },
    modifications: { parts: ['downpipe', 'intake', 'fuel_pump'], notes: 'Gravel rallies; anti-lag not wanted.' },
    revLimitRpm: 6700,
  },
  {
    vinStem: '5RL4U6PL?RK',
    modelYear: 2019,
    description: 'Hot hatch, 1.6 turbo I4, 6-speed manual',
    engine: { displacementL: 1.6, cylinders: 4, aspiration: 'turbocharged', family: '1.6 turbo I4' },
    transmission: { type: 'manual', gearRatios: [3.31, 2.13, 1.48, 1.09, 0.86, 0.69] },
    finalDrive: 4.06,
    tyreSize: '225/40R18',
    curbMassKg: 1250,
    fuel: { type: 'gasoline', octane: { scale: 'RON', rating: 98 }, ethanolPct: 0 },
    modifications: { parts: ['intake', 'downpipe'], notes: '' },
    revLimitRpm: 6800,
  },
];

export function demoVin(stem: string, serial: number): string {
  const draft = `${stem.replace('?', '0')}${String(100000 + serial).slice(-6)}`;
  const digit = vinCheckDigit(draft);
  return `${draft.slice(0, 8)}${digit ?? '0'}${draft.slice(9)}`;
}

/** A small deterministic generator, so the demo is the same on every machine. */
function prng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** What customers ask for, by what the package covers. */
const GOALS: Record<'engine' | 'transmission' | 'both', readonly string[]> = {
  engine: [
    'More mid-range torque for daily driving, keep it smooth in traffic.',
    'Track use: firm throttle response, raise the rev limit slightly, keep knock margin.',
    'Economy on the highway, no loss of drivability.',
    'Match the calibration to the new intake and exhaust; fix the lean idle.',
  ],
  transmission: [
    'Quicker, firmer up-shifts under load; hold the gear to the rev limit at full throttle.',
    'Smoother shifts in town and no hunting between gears on the highway.',
  ],
  both: [
    'Towing: stronger low-end, firmer shifts under load.',
    'More power for the new parts, with shift points and torque limits to match.',
  ],
};


/** What people write on a job at each step; the walk picks one line per occasion. */
const SAYS = {
  afterRead: ['Read is uploaded. It came off without errors in about four minutes.', 'Stock read is up. Car is on fresh fuel, nothing else changed since.', 'Uploaded the read. Let me know if you need anything else before you start.'],
  startWork: ['Starting on it today. Which fuel is in the tank right now?', 'On the bench now. Any warning lights or stored codes before the read?', 'Picked this one up. I will have revision 1 out within a day or two.'],
  afterFlash: ['Flashed revision {r} on the battery supporter, no errors. Logging tomorrow morning.', 'Revision {r} is on. Idle is steady; will do the log on the closed course at the weekend.', 'Flash went fine. Warm-up and log on Saturday.'],
  afterLog: ['Log is up. It pulled hard; slight hesitation around 3000 rpm in town.', 'Here is the log: full warm-up, then the pull. Felt strong, no stumbles.', 'Uploaded. Did the pull on the dyno this time, as you asked.'],
  reviseAgain: ['Trims are close. Fuel needs a touch at the top; revision {n} coming.', 'Looks healthy. A little more timing in the mid-range next; revision {n} to follow.', 'Full-throttle λ is a bit lean above 5000: adding fuel there in revision {n}.'],
  dialedIn: ['All checks pass and the trims are within ±3 %. This is the final one; enjoy it.', 'Clean log, no knock. Revision {r} is your final calibration.'],
  hold: ['Putting this on hold until the payment comes through.', 'On hold: waiting for the new injectors to be fitted before the next revision.'],
  cancel: ['Cancelling at the customer’s request: the car was sold.', 'Cancelled: the customer chose another package and opened a new job.'],
};

type Who = `c${number}` | `d${number}`;

/** One job of the scenario: whose, which vehicle model and package, where it stands now, and when things happened. */
interface PlannedJob {
  who: Who;
  vehicle: number;
  pkg: number;
  state: JobState;
  round: number;
  tuner: 0 | 1 | null;
  openedDaysAgo: number;
  /** Hours since the job's last move into its present state. */
  lastHoursAgo: number;
  /** For on_hold and cancelled: where the job stood. */
  from?: JobState;
  /** A tuner took it while it was ready, before starting work. */
  taken?: boolean;
  /** The latest log's drive; earlier logs of the job are a lean first try and clean ones after. */
  lastLog?: DriveKind;
  reRead?: 'matches' | 'differs';
  /** On the bench with the next revision uploaded as a draft by its tuner, waiting for the other tuner's approval. */
  draftAwaitingApproval?: boolean;
}

const j = (who: Who, vehicle: number, pkg: number, state: JobState, round: number, tuner: 0 | 1 | null, openedDaysAgo: number, lastHoursAgo: number, more: Partial<PlannedJob> = {}): PlannedJob => ({
  who,
  vehicle,
  pkg,
  state,
  round,
  tuner,
  openedDaysAgo,
  lastHoursAgo,
  ...more,
});

/** Kestrel's forty jobs: a handful in each open state this week, a history of finished ones, one or two open per customer. */
const KESTREL_PLAN: PlannedJob[] = [
  j('c3', 3, 0, 'intake', 0, null, 6.5, 156),
  j('c4', 7, 1, 'intake', 0, null, 1.2, 28),
  j('d0', 1, 2, 'intake', 0, null, 0.6, 14),
  j('c5', 10, 0, 'intake', 0, null, 0.2, 4),
  j('c1', 4, 2, 'ready', 0, null, 4, 70),
  j('c6', 0, 0, 'ready', 0, null, 2.5, 18),
  j('c7', 2, 1, 'ready', 0, null, 2, 20),
  j('d1', 8, 0, 'ready', 0, null, 1.5, 9),
  j('c8', 9, 0, 'ready', 0, 1, 1, 5, { taken: true }),
  j('c9', 2, 1, 'on_bench', 0, 0, 4, 30),
  j('c10', 0, 0, 'on_bench', 1, 0, 9, 20, { draftAwaitingApproval: true }),
  j('c2', 6, 0, 'on_bench', 2, 1, 16, 6),
  j('d0', 7, 1, 'on_bench', 1, 0, 12, 26),
  j('c11', 5, 0, 'on_bench', 0, 1, 3, 50),
  j('c0', 2, 2, 'with_customer', 1, 0, 7, 40),
  j('d1', 1, 1, 'with_customer', 1, 1, 10, 30),
  j('c12', 3, 0, 'with_customer', 2, 0, 24, 240, { reRead: 'differs' }),
  j('c13', 7, 1, 'with_customer', 3, 1, 30, 52),
  j('c1', 0, 0, 'with_customer', 1, 0, 8, 20),
  j('c0', 0, 0, 'log_review', 2, 0, 18, 5, { lastLog: 'knock', reRead: 'matches' }),
  j('c14', 10, 0, 'log_review', 1, 1, 9, 3, { lastLog: 'half_pedal' }),
  j('c2', 3, 0, 'log_review', 1, 0, 11, 20, { lastLog: 'lean' }),
  j('c7', 8, 1, 'log_review', 2, 1, 20, 16),
  j('c10', 6, 0, 'on_hold', 1, 0, 14, 100, { from: 'with_customer' }),
  j('c13', 4, 0, 'on_hold', 0, null, 6, 120, { from: 'ready' }),
  j('c0', 2, 0, 'dialed_in', 3, 0, 95, 62 * 24),
  j('c1', 4, 0, 'dialed_in', 2, 1, 80, 66 * 24),
  j('c2', 6, 0, 'dialed_in', 4, 1, 110, 85 * 24),
  j('d0', 1, 0, 'dialed_in', 3, 0, 70, 52 * 24),
  j('d1', 5, 0, 'dialed_in', 2, 1, 60, 47 * 24),
  j('c6', 3, 0, 'dialed_in', 3, 0, 100, 80 * 24),
  j('c8', 6, 0, 'dialed_in', 2, 1, 58, 44 * 24),
  j('c11', 2, 1, 'dialed_in', 3, 1, 75, 55 * 24),
  j('c12', 7, 1, 'dialed_in', 2, 0, 50, 36 * 24),
  j('c14', 1, 2, 'dialed_in', 4, 0, 44, 25 * 24),
  j('c4', 0, 0, 'dialed_in', 2, 1, 38, 27 * 24),
  j('c15', 0, 0, 'dialed_in', 2, 0, 105, 90 * 24),
  j('c16', 9, 0, 'dialed_in', 3, 1, 90, 72 * 24),
  j('c11', 5, 0, 'cancelled', 0, null, 40, 38 * 24, { from: 'intake' }),
  j('c17', 4, 0, 'cancelled', 1, 0, 50, 30 * 24, { from: 'with_customer' }),
];

const HARBOR_PLAN: PlannedJob[] = [
  j('c2', 3, 0, 'intake', 0, null, 1, 20),
  j('c4', 9, 0, 'ready', 0, null, 2, 30),
  j('c3', 4, 0, 'on_bench', 1, 0, 10, 20),
  j('c4', 1, 1, 'on_bench', 0, 0, 3, 40),
  j('c0', 7, 1, 'with_customer', 1, 0, 6, 30),
  j('c1', 0, 0, 'log_review', 1, 0, 8, 6),
  j('c1', 10, 0, 'on_hold', 0, null, 5, 100, { from: 'intake' }),
  j('c0', 5, 0, 'dialed_in', 3, 0, 70, 50 * 24),
  j('c2', 6, 0, 'dialed_in', 2, 0, 45, 30 * 24),
  j('c3', 2, 1, 'dialed_in', 2, 0, 30, 16 * 24),
];

export interface SeededJob {
  id: string;
  shopId: string;
  number: number;
  state: JobState;
  round: number;
  customerUserId: string;
  dealerId: string | null;
  vehicle: VehicleInput;
  customerName: string;
  modules: string[];
}

type Step =
  | { kind: 'read' | 'take' | 'start' | 'download' | 'log' | 'revise' | 'dialed_in' | 'hold' | 'cancel'; round: number }
  | { kind: 'revision'; round: number };

/** The moves from intake to the planned state, each one the state machine's own next step. */
function stepsTo(plan: PlannedJob): Step[] {
  const target = plan.state === 'on_hold' || plan.state === 'cancelled' ? plan.from! : plan.state;
  const steps: Step[] = [];
  const order: JobState[] = ['intake', 'ready', 'on_bench'];
  if (order.indexOf(target) !== 0) steps.push({ kind: 'read', round: 0 });
  if (plan.taken) steps.push({ kind: 'take', round: 0 });
  if (target !== 'intake' && target !== 'ready') steps.push({ kind: 'start', round: 0 });
  for (let r = 1; r <= plan.round; r++) {
    steps.push({ kind: 'revision', round: r });
    if (target === 'with_customer' && r === plan.round) break;
    steps.push({ kind: 'download', round: r }, { kind: 'log', round: r });
    if (target === 'log_review' && r === plan.round) break;
    steps.push({ kind: target === 'dialed_in' && r === plan.round ? 'dialed_in' : 'revise', round: r });
  }
  if (plan.state === 'on_hold') steps.push({ kind: 'hold', round: plan.round });
  if (plan.state === 'cancelled') steps.push({ kind: 'cancel', round: plan.round });
  return steps;
}

/** How long each step usually takes, relative to the others: the customer's drive and log take longest. */
const WEIGHT: Record<Step['kind'], number> = { read: 1, take: 0.4, start: 1.2, revision: 1.6, download: 0.5, log: 2.4, revise: 0.8, dialed_in: 0.8, hold: 1, cancel: 1 };

const silentMailer = { send: async () => {} };

/** "What changed" notes sent with each revision, by module and round, as a tuner writes them for the customer. */
const SEND_NOTES: Record<'ECM' | 'TCM', readonly string[]> = {
  ECM: [
    'First revision for your parts and fuel: full-throttle fuelling and spark set for them, torque limits raised, rev limit as agreed.',
    'From your log: added a little fuel at full throttle above 4,500 rpm where it ran lean, and took 1° of spark out near peak torque where the log showed knock retard.',
    'Part-throttle fuel trims corrected from your log; full throttle unchanged. Log two gears this time.',
    'Final touches: idle and cold-start fuelling smoothed; nothing changed at full throttle.',
  ],
  TCM: [
    'Shift points at full throttle moved up to just under the rev limit, and shifts above half pedal made firmer.',
    'Torque limits in the transmission raised to match the engine revision; part-throttle shifts softened.',
    'Downshift on kick-down made quicker; everything else as before.',
    'Converter lock-up at cruise moved a little lower; shift points unchanged.',
  ],
};
const sendNote = (modules: readonly CalibrationModule[], round: number) =>
  modules
    .filter((m): m is 'ECM' | 'TCM' => m === 'ECM' || m === 'TCM')
    .map((m) => `${modules.length > 1 ? `${m}: ` : ''}${SEND_NOTES[m][(round - 1) % SEND_NOTES[m].length]}`)
    .join(' ');

/** People work by day: a moment of the day is moved into 08:00–20:00 UTC of the same day, keeping the order. */
function daytime(at: Date, now: Date): Date {
  const day = Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate());
  const moved = new Date(day + 8 * 3_600_000 + (at.getTime() - day) / 2);
  return moved.getTime() < now.getTime() - 60_000 ? moved : at;
}

export interface JobsContext {
  db: Db;
  blobs: DiskBlobStore;
  now: Date;
  customerNames: Map<string, string>;
}

export async function seedJobs(ctx: JobsContext, shop: SeededShop, options: { plan: 'kestrel' | 'harbor'; seed: number; shopIndex: number }): Promise<SeededJob[]> {
  const { db, now } = ctx;
  const rand = prng(options.seed);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(rand() * list.length)]!;
  const hoursAgo = (h: number) => new Date(now.getTime() - h * 3_600_000);
  const kestrel = options.plan === 'kestrel';
  const packages = await Promise.all(
    (kestrel
      ? [
          { name: 'Engine calibration', modules: ['ECM'], retail: 59900, dealer: 44900, rounds: 4, description: 'ECM revision for your parts and fuel, with up to four log rounds.' },
          { name: 'Engine + transmission', modules: ['ECM', 'TCM'], retail: 89900, dealer: 69900, rounds: 5, description: 'ECM and TCM together: power, shift points and firmness.' },
          { name: 'Transmission only', modules: ['TCM'], retail: 39900, dealer: 29900, rounds: 3, description: 'Shift points, firmness and torque limits for the TCM.' },
        ]
      : [
          { name: 'Road calibration', modules: ['ECM'], retail: 54000, dealer: 42000, rounds: 4, description: 'ECM revision with dyno or road logs.' },
          { name: 'Complete drivetrain', modules: ['ECM', 'TCM'], retail: 82000, dealer: 64000, rounds: 5, description: 'ECM and TCM, tuned together.' },
        ]
    ).map((p, i) =>
      insertPackage(db, {
        id: newId(),
        shop_id: shop.shopId,
        name: p.name,
        description: p.description,
        modules: JSON.stringify(p.modules),
        retail_price_minor: p.retail,
        dealer_price_minor: p.dealer,
        rounds_included: p.rounds,
        created_at: hoursAgo(24 * (300 - i)).toISOString(),
      }),
    ),
  );

  // The clock the workflow reads: each step sets it to the moment the step happened.
  let at = now;
  const deps: JobFlowDeps = { db, clock: { now: () => at }, mailer: silentMailer, env: { APP_ORIGIN: 'http://localhost:8080' } };
  const auths = new Map<string, ShopAuth>();
  const authOf = async (userId: string): Promise<ShopAuth> => {
    let auth = auths.get(userId);
    if (!auth) {
      const user = (await findUserById(db, userId))!;
      const membership = (await findMembershipOfUser(db, shop.shopId, userId))!;
      const shopRow = (await findShopById(db, shop.shopId))!;
      const actor = buildActor(user, membership, shopRow);
      auth = { sessionId: 'demo-seed', readOnlyReason: null, user, shop: shopRow, membership, actor, ability: defineAbilityFor(actor) };
      auths.set(userId, auth);
    }
    return auth;
  };
  const files = new DemoFiles(db, ctx.blobs);
  const plan = (kestrel ? KESTREL_PLAN : HARBOR_PLAN)
    .map((p, i) => ({ ...p, openedAt: hoursAgo(p.openedDaysAgo * 24 + ((i * 7) % 9)) }))
    .sort((a, b) => a.openedAt.getTime() - b.openedAt.getTime());
  const vehicles = new Map<string, { id: string; spec: VehicleInput }>();
  const jobs: SeededJob[] = [];

  for (const [i, p] of plan.entries()) {
    const viaDealer = p.who.startsWith('d');
    const index = Number(p.who.slice(1));
    const customerId = (viaDealer ? shop.dealerCustomerIds : shop.customerIds)[index]!;
    const dealerId = viaDealer ? shop.dealerId : null;
    const uploaderId = viaDealer && i % 2 === 0 ? shop.dealerUserId! : customerId;
    const tunerId = p.tuner === null ? null : shop.tunerIds[Math.min(p.tuner, shop.tunerIds.length - 1)]!;
    const shopSide = tunerId ?? shop.ownerId;
    const vehicleKey = `${customerId}:${p.vehicle}`;
    let vehicle = vehicles.get(vehicleKey);
    if (!vehicle) {
      const { vinStem, ...rest } = VEHICLES[p.vehicle]!;
      const spec: VehicleInput = { ...rest, modelYear: rest.modelYear - (i % 3), vin: '', vinCheckDigitOverride: false };
      spec.vin = demoVin(vinStem.slice(0, 9) + 'ABCDEFGHJKLMNPRSTVWXY123456789'[spec.modelYear - 2010]! + vinStem.slice(10), options.seed * 1000 + i);
      const created = new Date(p.openedAt.getTime() - 3_600_000).toISOString();
      const row = await insertVehicle(db, { id: newId(), shop_id: shop.shopId, owner_user_id: customerId, dealer_id: dealerId, vin: spec.vin, model_year: spec.modelYear, description: spec.description, spec: JSON.stringify(spec), created_at: created, updated_at: created });
      vehicle = { id: row.id, spec };
      vehicles.set(vehicleKey, vehicle);
    }
    const pkg = packages[p.pkg]!;
    const modules = JSON.parse(pkg.modules) as CalibrationModule[];
    const number = 1001 + i;
    const opened = p.openedAt.toISOString();
    const job = await insertJob(db, {
      id: newId(),
      shop_id: shop.shopId,
      number,
      vehicle_id: vehicle.id,
      customer_user_id: customerId,
      dealer_id: dealerId,
      package_id: pkg.id,
      assigned_tuner_id: null,
      state: 'intake',
      held_from: null,
      round: 0,
      goals: pick(GOALS[modules.length === 2 ? 'both' : modules[0] === 'TCM' ? 'transmission' : 'engine']),
      special_requests: JSON.stringify(i % 5 === 0 ? { revLimit: { rpm: vehicle.spec.revLimitRpm + 200, notes: 'Only if knock margin allows.' } } : {}),
      log_request: JSON.stringify(defaultLogRequest(vehicle.spec.engine.family, 1)),
      cautions_accepted_at: opened,
      state_changed_at: opened,
      created_by_user_id: viaDealer ? shop.dealerUserId! : customerId,
      created_at: opened,
      updated_at: opened,
    });
    await recordAudit(db, { shopId: shop.shopId, actorUserId: viaDealer ? shop.dealerUserId : customerId, action: 'job.opened', subjectType: 'Job', subjectId: job.id, at: p.openedAt });
    const fileJob = { id: job.id, shopId: shop.shopId, key: `${options.shopIndex}:${number}`, vehicleDescription: vehicle.spec.description };

    // Spread the steps between opening and the last move by their usual length, with some variety.
    const steps = stepsTo(p);
    const end = hoursAgo(p.lastHoursAgo).getTime();
    const weights = steps.map((s) => WEIGHT[s.kind] * (0.6 + 0.8 * rand()));
    const total = weights.reduce((a, b) => a + b, 0);
    let elapsed = 0;
    const say = async (userId: string, lines: readonly string[], vars: Record<string, number>, later: number) => {
      at = new Date(at.getTime() + later);
      if (at.getTime() >= now.getTime()) return;
      const body = pick(lines).replace(/\{(\w)\}/g, (_, k: string) => String(vars[k]));
      await postJobMessage(deps, await authOf(userId), (await findJob(db, shop.shopId, job.id))!, body);
    };
    const move = async (userId: string, to: JobState, bySystem = false) => {
      await moveJob(deps, await authOf(userId), job.id, to, { bySystem });
    };
    for (const [k, step] of steps.entries()) {
      elapsed += weights[k]!;
      at = daytime(new Date(p.openedAt.getTime() + ((end - p.openedAt.getTime()) * elapsed) / total), now);
      const r = step.round;
      switch (step.kind) {
        case 'read':
          for (const module of modules) await files.read(fileJob, module, uploaderId, at);
          await setJobFacts(db, shop.shopId, job.id, { hasStockRead: true }, at);
          await move(uploaderId, 'ready', true);
          if (rand() < 0.5) await say(uploaderId, SAYS.afterRead, {}, 600_000);
          break;
        case 'take':
          await takeJob(deps, await authOf(tunerId!), job.id);
          break;
        case 'start':
          await move(shopSide, 'on_bench');
          if (rand() < 0.5) await say(shopSide, SAYS.startWork, {}, 900_000);
          break;
        case 'revision':
          if (r === 2) {
            // The second round asks for more full-throttle gears, as the shop's log request does.
            await updateJob(db, shop.shopId, job.id, { log_request: JSON.stringify(defaultLogRequest(vehicle.spec.engine.family, 2)) });
            await recordAudit(db, { shopId: shop.shopId, actorUserId: shopSide, action: 'job.log_request_changed', subjectType: 'Job', subjectId: job.id, at });
          }
          for (const module of modules) await files.revision(fileJob, module, r, shopSide, at);
          await setJobFacts(db, shop.shopId, job.id, { hasRevisionForRound: true }, at);
          // Uploaded as a draft; the bench sends it an hour later with its note, as the job page's form does.
          at = new Date(Math.min(at.getTime() + 3_600_000, now.getTime() - 60_000));
          await moveJob(deps, await authOf(shopSide), job.id, 'with_customer', { note: sendNote(modules, r) });
          break;
        case 'download':
          for (const module of modules) await files.downloaded(fileJob, module, uploaderId, at);
          if (rand() < 0.4) await say(uploaderId, SAYS.afterFlash, { r }, 3_600_000);
          break;
        case 'log': {
          const last = r === p.round;
          if (last && p.reRead) await files.reRead(fileJob, modules[0]!, p.reRead === 'matches', uploaderId, new Date(at.getTime() - 1_800_000));
          // Every third job's first log was recorded without the pedal on the floor, so log quality has something to show.
          const kind: DriveKind = last ? (p.lastLog ?? 'good') : r === 1 ? (i % 3 === 0 ? 'half_pedal' : 'lean') : 'good';
          const logRequest = JSON.parse((await findJob(db, shop.shopId, job.id))!.log_request) as LogRequest;
          await storeDemoLog(db, ctx.blobs, { shopId: shop.shopId, jobId: job.id, vehicle: vehicle.spec, round: r, kind, logRequest, by: uploaderId, at, name: `rev${r}-${at.toISOString().slice(0, 10)}.csv` });
          at = new Date(at.getTime() + 20_000);
          await setJobFacts(db, shop.shopId, job.id, { hasLogForRound: true }, at);
          await move(uploaderId, 'log_review', true);
          if (rand() < 0.5) await say(uploaderId, SAYS.afterLog, {}, 300_000);
          break;
        }
        case 'revise':
          await move(shopSide, 'on_bench');
          await say(shopSide, SAYS.reviseAgain, { n: r + 1 }, 600_000);
          break;
        case 'dialed_in':
          await move(shopSide, 'dialed_in');
          await say(shopSide, SAYS.dialedIn, { r }, 600_000);
          break;
        case 'hold':
          await move(tunerId ?? shop.ownerId, 'on_hold');
          await say(tunerId ?? shop.ownerId, SAYS.hold, {}, 300_000);
          break;
        case 'cancel':
          await move(p.from === 'intake' ? customerId : shop.ownerId, 'cancelled');
          await say(shop.ownerId, SAYS.cancel, {}, 300_000);
          break;
      }
    }
    // The first customer's job with them is unpaid: its revision waits locked until paid (the demo's locked revision).
    const lockedUntilPaid = !viaDealer && index === 0;
    if (p.state === 'with_customer' && !lockedUntilPaid) {
      // The customer has the revision: downloaded it, and one of them re-read the car with their own tool since.
      at = new Date(at.getTime() + (now.getTime() - at.getTime()) * 0.3);
      for (const module of modules) await files.downloaded(fileJob, module, uploaderId, at);
      if (p.reRead) await files.reRead(fileJob, modules[0]!, p.reRead === 'matches', uploaderId, new Date(at.getTime() + 7_200_000));
    }
    if (p.draftAwaitingApproval) {
      // The next revision, uploaded by the job's tuner under the shop's approval setting, for the other tuner to approve.
      at = new Date(at.getTime() + (now.getTime() - at.getTime()) * 0.5);
      for (const module of modules) await files.revision(fileJob, module, p.round + 1, shopSide, at);
      await db.updateTable('calibration_files').set({ approval_required: 1 }).where('shop_id', '=', shop.shopId).where('job_id', '=', job.id).where('for_round', '=', p.round + 1).execute();
      await updateJob(db, shop.shopId, job.id, { has_revision_for_round: 1, drafts_awaiting_approval: modules.length, updated_at: at.toISOString() });
    }
    const row = (await findJob(db, shop.shopId, job.id))!;
    if (row.state !== p.state || row.round !== p.round) throw new Error(`demo job ${number} walked to ${row.state} round ${row.round}, planned ${p.state} round ${p.round}`);
    jobs.push({ id: job.id, shopId: shop.shopId, number, state: row.state, round: row.round, customerUserId: customerId, dealerId, vehicle: vehicle.spec, customerName: ctx.customerNames.get(customerId) ?? 'customer', modules });
  }
  // Kestrel asks for a second person's approval of every revision draft (set after the history, which predates it).
  if (kestrel) await updateShop(db, shop.shopId, { revision_approval: 1 });
  return jobs;
}

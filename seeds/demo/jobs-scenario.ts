import { insertAuditEvent, insertJob, insertJobMessage, insertPackage, insertVehicle, newId, type Db } from '@revloop/db';
import { defaultLogRequest } from '@revloop/domain/datalog';
import type { JobState } from '@revloop/domain/jobs';
import { vinCheckDigit, type VehicleInput } from '@revloop/domain/vehicles';
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

const GOALS = [
  'More mid-range torque for daily driving, keep it smooth in traffic.',
  'Track use: firm throttle response, raise the rev limit slightly, keep knock margin.',
  'Towing: stronger low-end, firmer shifts under load.',
  'Economy on the highway, no loss of drivability.',
  'Match the calibration to the new intake and exhaust; fix the lean idle.',
];

const MESSAGES: Array<[from: 'customer' | 'shop', body: string]> = [
  ['customer', 'Uploaded the stock read. Anything else you need before you start?'],
  ['shop', 'Got it, thanks. Which fuel are you running right now — pump 93 or an ethanol blend?'],
  ['customer', 'Pump 93, E10 at most.'],
  ['shop', 'Revision sent. Warm up fully, one gear at full throttle on a closed course, then send the log.'],
  ['customer', 'Log uploaded. It pulled hard; slight hesitation around 3000 rpm.'],
];

interface StatePlan {
  state: JobState;
  round: number;
  heldFrom?: JobState;
  staleDays?: number;
}

/** Forty jobs spread over every state and both tuners, some left to go stale. */
const KESTREL_PLAN: StatePlan[] = [
  ...Array.from({ length: 5 }, (_, i): StatePlan => ({ state: 'intake', round: 0, staleDays: i === 0 ? 6 : 0 })),
  ...Array.from({ length: 5 }, (_, i): StatePlan => ({ state: 'ready', round: 0, staleDays: i < 2 ? 3 : 0 })),
  ...Array.from({ length: 8 }, (_, i): StatePlan => ({ state: 'on_bench', round: i % 3, staleDays: i === 0 ? 4 : 0 })),
  ...Array.from({ length: 8 }, (_, i): StatePlan => ({ state: 'with_customer', round: 1 + (i % 3), staleDays: i < 2 ? 10 : 0 })),
  ...Array.from({ length: 5 }, (_, i): StatePlan => ({ state: 'log_review', round: 1 + (i % 2), staleDays: i === 0 ? 2 : 0 })),
  ...Array.from({ length: 6 }, (_, i): StatePlan => ({ state: 'dialed_in', round: 2 + (i % 3) })),
  { state: 'on_hold', round: 0, heldFrom: 'ready', staleDays: 9 },
  { state: 'on_hold', round: 1, heldFrom: 'with_customer' },
  { state: 'cancelled', round: 1 },
];

const HARBOR_PLAN: StatePlan[] = [
  { state: 'intake', round: 0 },
  { state: 'ready', round: 0 },
  { state: 'on_bench', round: 0 },
  { state: 'on_bench', round: 1 },
  { state: 'with_customer', round: 1 },
  { state: 'with_customer', round: 2, staleDays: 9 },
  { state: 'log_review', round: 1 },
  { state: 'dialed_in', round: 3 },
  { state: 'dialed_in', round: 2 },
  { state: 'on_hold', round: 0, heldFrom: 'intake' },
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

export async function seedJobs(
  db: Db,
  shop: SeededShop,
  options: { plan: 'kestrel' | 'harbor'; now: Date; customerNames: Map<string, string>; seed: number },
): Promise<SeededJob[]> {
  const rand = prng(options.seed);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(rand() * list.length)]!;
  const hoursAgo = (h: number) => new Date(options.now.getTime() - h * 3_600_000).toISOString();
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
        created_at: hoursAgo(24 * (300 - i)),
      }),
    ),
  );

  const directCustomers = shop.customerIds;
  const dealerCustomers = shop.dealerCustomerIds;
  const plan = kestrel ? KESTREL_PLAN : HARBOR_PLAN;
  const jobs: SeededJob[] = [];
  const vehicleOf = new Map<string, { id: string; spec: VehicleInput }>();

  for (const [i, step] of plan.entries()) {
    // Every fourth Kestrel job comes through the dealer; the first direct customer gets several.
    const viaDealer = kestrel && dealerCustomers.length > 0 && i % 4 === 1;
    const customerId = viaDealer ? dealerCustomers[Math.floor(i / 4) % dealerCustomers.length]! : directCustomers[i % directCustomers.length]!;
    const dealerId = viaDealer ? shop.dealerId : null;
    const ageHours = 24 * (60 - i) + Math.floor(rand() * 12);
    let vehicle = vehicleOf.get(`${customerId}:${i % 2}`);
    if (!vehicle) {
      const template = VEHICLES[(i * 7 + options.seed) % VEHICLES.length]!;
      const { vinStem, ...rest } = template;
      const spec: VehicleInput = { ...rest, vin: demoVin(vinStem, options.seed * 1000 + i), vinCheckDigitOverride: false };
      const row = await insertVehicle(db, {
        id: newId(),
        shop_id: shop.shopId,
        owner_user_id: customerId,
        dealer_id: dealerId,
        vin: spec.vin,
        model_year: spec.modelYear,
        description: spec.description,
        spec: JSON.stringify(spec),
        created_at: hoursAgo(ageHours + 1),
        updated_at: hoursAgo(ageHours + 1),
      });
      vehicle = { id: row.id, spec };
      vehicleOf.set(`${customerId}:${i % 2}`, vehicle);
    }
    const pkg = packages[i % packages.length]!;
    const assigned = step.state === 'intake' || (step.state === 'ready' && i % 2 === 0) ? null : shop.tunerIds[i % shop.tunerIds.length]!;
    const inStateHours = step.staleDays ? step.staleDays * 24 : Math.floor(rand() * 20) + 1;
    const number = 1001 + i;
    const logRequest = defaultLogRequest(vehicle.spec.engine.family, Math.max(1, step.round));
    const job = await insertJob(db, {
      id: newId(),
      shop_id: shop.shopId,
      number,
      vehicle_id: vehicle.id,
      customer_user_id: customerId,
      dealer_id: dealerId,
      package_id: pkg.id,
      assigned_tuner_id: assigned,
      state: step.state,
      held_from: step.heldFrom ?? null,
      round: step.round,
      has_stock_read: step.state === 'intake' || (step.state === 'on_hold' && step.heldFrom === 'intake') ? 0 : 1,
      has_revision_for_round: 0,
      has_log_for_round: step.state === 'log_review' ? 1 : 0,
      goals: pick(GOALS),
      special_requests: JSON.stringify(i % 5 === 0 ? { revLimit: { rpm: vehicle.spec.revLimitRpm + 200, notes: 'Only if knock margin allows.' } } : {}),
      log_request: JSON.stringify(logRequest),
      cautions_accepted_at: hoursAgo(ageHours),
      state_changed_at: hoursAgo(Math.min(inStateHours, ageHours)),
      created_by_user_id: customerId,
      created_at: hoursAgo(ageHours),
      updated_at: hoursAgo(Math.min(inStateHours, ageHours)),
    });
    await insertAuditEvent(db, { id: newId(), shop_id: shop.shopId, actor_user_id: customerId, action: 'job.opened', subject_type: 'Job', subject_id: job.id, created_at: hoursAgo(ageHours) });
    if (step.state !== 'intake') {
      await insertAuditEvent(db, {
        id: newId(),
        shop_id: shop.shopId,
        actor_user_id: assigned ?? shop.ownerId,
        action: 'job.moved',
        subject_type: 'Job',
        subject_id: job.id,
        details: JSON.stringify({ from: step.heldFrom ?? 'intake', to: step.state, round: step.round }),
        created_at: hoursAgo(Math.min(inStateHours, ageHours)),
      });
    }
    const messageCount = step.state === 'intake' ? 0 : Math.min(MESSAGES.length, 1 + (i % 4));
    for (let m = 0; m < messageCount; m++) {
      const [from, body] = MESSAGES[m]!;
      await insertJobMessage(db, {
        id: newId(),
        shop_id: shop.shopId,
        job_id: job.id,
        author_user_id: from === 'customer' ? customerId : (assigned ?? shop.ownerId),
        body,
        created_at: hoursAgo(ageHours - m * 3 - 1),
      });
    }
    jobs.push({
      id: job.id,
      shopId: shop.shopId,
      number,
      state: step.state,
      round: step.round,
      customerUserId: customerId,
      dealerId,
      vehicle: vehicle.spec,
      customerName: options.customerNames.get(customerId) ?? 'customer',
      modules: JSON.parse(pkg.modules) as string[],
    });
  }
  return jobs;
}

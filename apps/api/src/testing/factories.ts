import { appendLedgerEntry, insertDealer, insertMembership, insertPayment, insertPackage, insertShop, insertShopSubscription, insertUser, insertVehicle, newId, type CalibrationModule } from '@revloop/db';
import type { LedgerKind, PlanId, SubscriptionStatus } from '@revloop/domain/billing';
import type { ShopRole } from '@revloop/domain/auth';
import { generateLog } from '@revloop/domain/datalog/testing';
import type { JobState } from '@revloop/domain/jobs';
import { hashPassword } from '../features/auth/password';
import { signIn, TEST_PASSWORD, type TestApp } from './test-app';
import { TEST_VEHICLE } from './test-vehicle';

// Small builders for API tests: each makes exactly the rows a test names, with made-up people and prices that
// stand for nothing (no check compares against them). Jobs past intake are walked there through the HTTP routes.

export interface TestUser {
  id: string;
  email: string;
  name: string;
}
export interface TestMember extends TestUser {
  shopId: string;
  role: ShopRole;
  dealerId: string | null;
}
export interface TestShop {
  id: string;
  name: string;
  currency: string;
  owner: TestMember;
}
export interface TestDealer {
  id: string;
  shopId: string;
  name: string;
}
export interface TestPackage {
  id: string;
  shopId: string;
  name: string;
  modules: CalibrationModule[];
  retailPriceMinor: number;
  dealerPriceMinor: number;
}
export interface TestVehicle {
  id: string;
  ownerUserId: string;
}
export interface TestJob {
  id: string;
  number: number;
  state: JobState;
  round: number;
  shop: TestShop;
  customer: TestMember;
  tuner: TestMember | null;
  package: TestPackage;
  vehicleId: string;
}

let sequence = 0;
const next = () => ++sequence;
let passwordHash: Promise<string> | undefined;
// Hashing is the slow part of making a person, and every factory person shares the test password.
const testPasswordHash = () => (passwordHash ??= hashPassword(TEST_PASSWORD));
const now = (t: TestApp) => t.clock.now().toISOString();

export async function createUser(t: TestApp, fields: { email?: string; name?: string; platformAdmin?: boolean } = {}): Promise<TestUser> {
  const n = next();
  const row = await insertUser(t.db, {
    id: newId(),
    email: fields.email ?? `person${n}@factory.test`,
    name: fields.name ?? `Person ${n}`,
    password_hash: await testPasswordHash(),
    platform_admin: fields.platformAdmin ? 1 : 0,
    created_at: now(t),
  });
  return { id: row.id, email: row.email, name: row.name };
}

export const createPlatformAdmin = (t: TestApp, fields: { email?: string; name?: string } = {}) => createUser(t, { ...fields, platformAdmin: true });

/** A shop and its owner, as sign-up leaves it. */
export async function createShop(t: TestApp, fields: { name?: string; currency?: string; ownerEmail?: string; ownerName?: string } = {}): Promise<TestShop> {
  const n = next();
  const shop = await insertShop(t.db, { id: newId(), name: fields.name ?? `Shop ${n}`, currency: fields.currency ?? 'USD', created_at: now(t) });
  const owner = await addMember(t, shop.id, 'owner', { email: fields.ownerEmail ?? `owner${n}@factory.test`, ...(fields.ownerName && { name: fields.ownerName }) });
  return { id: shop.id, name: shop.name, currency: shop.currency, owner };
}

async function addMember(t: TestApp, shopId: string, role: ShopRole, fields: { email?: string; name?: string; dealerId?: string | null }): Promise<TestMember> {
  const user = await createUser(t, fields);
  const dealerId = fields.dealerId ?? null;
  await insertMembership(t.db, { id: newId(), shop_id: shopId, user_id: user.id, role, dealer_id: dealerId, created_at: now(t) });
  return { ...user, shopId, role, dealerId };
}

/** A member of the shop in a role; a dealer's people (the dealer user, its customers) name the dealer. */
export function createMember(t: TestApp, shop: TestShop, role: ShopRole, fields: { email?: string; name?: string; dealer?: TestDealer } = {}): Promise<TestMember> {
  if (role === 'dealer' && !fields.dealer) throw new Error('a dealer member needs its dealer');
  return addMember(t, shop.id, role, { ...fields, dealerId: fields.dealer?.id ?? null });
}

export const createCustomer = (t: TestApp, shop: TestShop, fields: { email?: string; name?: string; dealer?: TestDealer } = {}) => createMember(t, shop, 'customer', fields);

export async function createDealer(t: TestApp, shop: TestShop, fields: { name?: string } = {}): Promise<TestDealer> {
  const n = next();
  const row = await insertDealer(t.db, { id: newId(), shop_id: shop.id, name: fields.name ?? `Dealer ${n}`, contact_name: `Contact ${n}`, contact_email: `dealer${n}@factory.test`, phone: null, created_at: now(t) });
  return { id: row.id, shopId: shop.id, name: row.name };
}

export async function createPackage(
  t: TestApp,
  shop: TestShop,
  fields: { name?: string; modules?: CalibrationModule[]; retailPriceMinor?: number; dealerPriceMinor?: number; roundsIncluded?: number } = {},
): Promise<TestPackage> {
  const modules = fields.modules ?? ['ECM'];
  const row = await insertPackage(t.db, {
    id: newId(),
    shop_id: shop.id,
    name: fields.name ?? `Package ${next()}`,
    description: '',
    modules: JSON.stringify(modules),
    retail_price_minor: fields.retailPriceMinor ?? 50_000,
    dealer_price_minor: fields.dealerPriceMinor ?? 40_000,
    rounds_included: fields.roundsIncluded ?? 3,
    created_at: now(t),
  });
  return { id: row.id, shopId: shop.id, name: row.name, modules, retailPriceMinor: row.retail_price_minor, dealerPriceMinor: row.dealer_price_minor };
}

export async function createVehicle(t: TestApp, customer: TestMember, spec: typeof TEST_VEHICLE = TEST_VEHICLE): Promise<TestVehicle> {
  const at = now(t);
  const row = await insertVehicle(t.db, {
    id: newId(),
    shop_id: customer.shopId,
    owner_user_id: customer.id,
    dealer_id: customer.dealerId,
    vin: spec.vin,
    model_year: spec.modelYear,
    description: spec.description,
    spec: JSON.stringify({ ...spec, vinCheckDigitOverride: false }),
    created_at: at,
    updated_at: at,
  });
  return { id: row.id, ownerUserId: customer.id };
}

/** A paid plan with no provider behind it (without one, a shop starts its trial when billing first looks). */
export async function createSubscription(t: TestApp, shop: TestShop, fields: { planId?: PlanId; seats?: number; status?: SubscriptionStatus } = {}): Promise<void> {
  await insertShopSubscription(t.db, {
    shop_id: shop.id,
    plan_id: fields.planId ?? 'workshop',
    seats: fields.seats ?? 2,
    status: fields.status ?? 'active',
    trial_ends_at: null,
    current_period_end: null,
    past_due_since: null,
    read_only_reason: null,
    stripe_customer_id: null,
    stripe_subscription_id: null,
    provider_clock: null,
    created_at: now(t),
    updated_at: now(t),
  });
}

/** A small raw image, different for every (module, kind, round), so no two uploads share a hash. */
const rawImage = (seed: number) => Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 7 + seed) & 0xff));
const imageSeed = (module: CalibrationModule, round: number) => ['ECM', 'TCM', 'other'].indexOf(module) * 31 + round * 3 + 1;

export interface JobOptions {
  /** The state to walk the job to; on_hold and cancelled are reached from `from` (intake unless said). */
  state?: JobState;
  from?: JobState;
  /** Revisions sent before stopping: defaults to 1 for states after the first revision (on_bench with a round is the next round's bench). */
  round?: number;
  customer?: TestMember;
  tuner?: TestMember;
  package?: TestPackage;
  vehicle?: TestVehicle;
  goals?: string;
}

type Agent = Awaited<ReturnType<typeof signIn>>;

async function ok<T extends { status: number; body: unknown }>(what: string, res: Promise<T> | T, status = 200): Promise<T> {
  const answer = await res;
  if (answer.status !== status) throw new Error(`${what} answered ${answer.status}: ${JSON.stringify(answer.body)}`);
  return answer;
}

/**
 * A job opened through the intake route and walked to `state` by the same routes people use: the customer uploads the
 * stock read and the logs, the bench (the tuner, or the owner) starts work, uploads each revision and sends it with a
 * note, and decides. The shop is left as made (no approval asked for), so the bench sends its own drafts.
 */
export async function createJob(t: TestApp, shop: TestShop, options: JobOptions = {}): Promise<TestJob> {
  const state = options.state ?? 'intake';
  const target = state === 'on_hold' || state === 'cancelled' ? (options.from ?? 'intake') : state;
  const rounds = options.round ?? (['with_customer', 'log_review', 'dialed_in'].includes(target) ? 1 : 0);
  const customer = options.customer ?? (await createCustomer(t, shop));
  const pkg = options.package ?? (await createPackage(t, shop));
  const vehicle = options.vehicle ?? (await createVehicle(t, customer));
  const agents = new Map<string, Promise<Agent>>();
  const as = (person: TestUser) => {
    if (!agents.has(person.id)) agents.set(person.id, signIn(t.app, person.email));
    return agents.get(person.id)!;
  };
  const owner = await as(shop.owner);
  const opened = await ok(
    'opening the job',
    owner.post('/api/jobs').send({
      customer: { kind: 'existing', customerUserId: customer.id },
      vehicle: { kind: 'existing', vehicleId: vehicle.id },
      packageId: pkg.id,
      goals: options.goals ?? 'More response, same manners.',
      cautionsAccepted: true,
    }),
    201,
  );
  const id: string = opened.body.data.id;
  if (options.tuner) await ok('assigning the tuner', owner.post(`/api/jobs/${id}/assign`).send({ tunerId: options.tuner.id }));
  const bench = await as(options.tuner ?? shop.owner);
  const move = (agent: Agent, to: JobState) => ok(`moving to ${to}`, agent.post(`/api/jobs/${id}/transitions`).send({ to }));
  const upload = (agent: Agent, module: CalibrationModule, kind: 'read' | 'revision', round: number) =>
    ok(`uploading the ${kind} of ${module}`, agent.post(`/api/jobs/${id}/files`).field('module', module).field('kind', kind).attach('file', rawImage(imageSeed(module, round)), `${module}-${kind}-${round}.bin`), 201);

  if (target !== 'intake') {
    const customerAgent = await as(customer);
    for (const module of pkg.modules) await upload(customerAgent, module, 'read', 0);
    if (target !== 'ready') await move(bench, 'on_bench');
    for (let r = 1; r <= rounds; r++) {
      for (const module of pkg.modules) await upload(bench, module, 'revision', r);
      // A revision is a draft until the bench sends it with a note of what changed.
      await ok('sending the revision', bench.post(`/api/jobs/${id}/transitions`).send({ to: 'with_customer', note: `Revision ${r}: fuel and timing for the logged conditions.` }));
      if (target === 'with_customer' && r === rounds) break;
      const log = await ok('uploading a log', customerAgent.post(`/api/jobs/${id}/datalogs`).attach('file', Buffer.from(generateLog({ seed: r }).text), `drive-${r}.csv`), 202);
      await settledLog(customerAgent, log.body.data.id);
      if (target === 'log_review' && r === rounds) break;
      // Back on the bench for the next round, or (after the last) dialed in, unless the bench is where the job should stay.
      await move(bench, r === rounds && target === 'dialed_in' ? 'dialed_in' : 'on_bench');
    }
  }
  if (state === 'on_hold') await move(owner, 'on_hold');
  if (state === 'cancelled') await move(owner, 'cancelled');
  const job = (await ok('reading the job', owner.get(`/api/jobs/${id}`))).body.data;
  if (job.state !== state) throw new Error(`the job walked to ${job.state}, not ${state}`);
  return { id, number: job.number, state: job.state, round: job.round, shop, customer, tuner: options.tuner ?? null, package: pkg, vehicleId: vehicle.id };
}

/** Waits for the log's analysis, which moves the job on when it ends. */
async function settledLog(agent: Agent, id: string): Promise<void> {
  for (let i = 0; i < 300; i++) {
    const res = await ok('reading the log', agent.get(`/api/datalogs/${id}`));
    if (res.body.data.status === 'ready') return;
    if (res.body.data.status !== 'processing') throw new Error(`the log ended ${res.body.data.status}: ${res.body.data.error}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  throw new Error('the log analysis did not finish');
}

/** Two shops with a person in every role, for the tests that check roles and tenancy. */
export async function createTwoShops(t: TestApp) {
  const shop = await createShop(t);
  const dealer = await createDealer(t, shop);
  const people = {
    owner: shop.owner,
    tuner: await createMember(t, shop, 'tuner'),
    dealer: await createMember(t, shop, 'dealer', { dealer }),
    customer: await createCustomer(t, shop),
  };
  const other = await createShop(t);
  return { shop, dealer, people, other };
}

/** One entry on the dealer's statement (a top-up unless said), so jobs for the dealer's customers can be debited. */
export async function createLedgerEntry(t: TestApp, dealer: TestDealer, fields: { amountMinor?: number; kind?: LedgerKind; currency?: string } = {}): Promise<{ id: string; balanceAfterMinor: number }> {
  const row = await appendLedgerEntry(t.db, {
    shopId: dealer.shopId,
    dealerId: dealer.id,
    kind: fields.kind ?? 'top_up',
    amountMinor: fields.amountMinor ?? 200_000,
    currency: fields.currency ?? 'USD',
    memo: 'Factory entry',
    at: now(t),
  });
  return { id: row.id, balanceAfterMinor: row.balance_after_minor };
}

/** A job payment the provider has confirmed, as the webhook leaves it (for tests that read money, not take it). */
export async function createPayment(t: TestApp, job: TestJob, fields: { amountMinor?: number } = {}): Promise<{ id: string; amountMinor: number }> {
  const n = next();
  const row = await insertPayment(t.db, {
    id: newId(),
    shop_id: job.shop.id,
    purpose: 'job',
    job_id: job.id,
    dealer_id: null,
    payer_user_id: job.customer.id,
    amount_minor: fields.amountMinor ?? job.package.retailPriceMinor,
    currency: job.shop.currency,
    status: 'paid',
    stripe_checkout_session_id: `cs_factory_${n}`,
    stripe_payment_intent_id: `pi_factory_${n}`,
    created_at: now(t),
    paid_at: now(t),
  });
  return { id: row.id, amountMinor: row.amount_minor };
}

/**
 * Pays a retail job in full as a landed Checkout leaves it (the webhook's result), so its customer may download the
 * revisions a shop keeps locked until paid. Tests that take the money through Checkout itself use the Stripe stand-in.
 */
export const payJob = (t: TestApp, job: TestJob) => createPayment(t, job, { amountMinor: job.package.retailPriceMinor });

import {
  dialectOf,
  insertDealer,
  insertMembership,
  insertShop,
  insertUser,
  newId,
  type Db,
} from '@revloop/db';
import { sql } from 'kysely';
import type { ShopRole } from '@revloop/domain/auth';
import { hashPassword, type DiskBlobStore } from '@revloop/api';
import { seedBilling } from './billing-scenario';
import { seedCustomers, seedLogRequestDefaults } from './customers-scenario';
import { seedJobs, type SeededJob } from './jobs-scenario';
import { seedRentals } from './rentals-scenario';
import { DEMO_ADMIN, DEMO_PASSWORD, HARBOR, KESTREL } from './people';

export interface SeededShop {
  shopId: string;
  ownerId: string;
  tunerIds: string[];
  customerIds: string[];
  dealerId: string | null;
  dealerUserId: string | null;
  dealerCustomerIds: string[];
}

export interface DemoIds {
  adminId: string;
  kestrel: SeededShop;
  harbor: SeededShop;
  jobs: SeededJob[];
}

export interface SeedOptions {
  /** Where the demo's calibration files and logs are stored. */
  blobs: DiskBlobStore;
}

/** Loads the invented scenario into an empty, migrated database. Times are spread back from `now`. */
export async function seedDemo(db: Db, now: Date, options: SeedOptions): Promise<DemoIds> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const daysAgo = (d: number) => new Date(now.getTime() - d * 86_400_000).toISOString();

  const user = async (p: { email: string; name: string }, createdDaysAgo: number, platformAdmin = false) =>
    (
      await insertUser(db, {
        id: newId(),
        email: p.email,
        name: p.name,
        password_hash: passwordHash,
        platform_admin: platformAdmin ? 1 : 0,
        created_at: daysAgo(createdDaysAgo),
      })
    ).id;

  const member = async (shopId: string, userId: string, role: ShopRole, createdDaysAgo: number, dealerId: string | null = null) => {
    await insertMembership(db, { id: newId(), shop_id: shopId, user_id: userId, role, dealer_id: dealerId, created_at: daysAgo(createdDaysAgo) });
  };

  const adminId = await user(DEMO_ADMIN, 400, true);

  const kestrelId = (await insertShop(db, { id: newId(), name: KESTREL.name, currency: KESTREL.currency, slug: KESTREL.slug, description: KESTREL.description, public_page: 1, created_at: daysAgo(320) })).id;
  const kOwner = await user(KESTREL.owner, 320);
  await member(kestrelId, kOwner, 'owner', 320);
  const kTuners: string[] = [];
  for (const [i, t] of KESTREL.tuners.entries()) {
    const id = await user(t, 300 - i * 90);
    await member(kestrelId, id, 'tuner', 300 - i * 90);
    kTuners.push(id);
  }
  const dealer = await insertDealer(db, {
    id: newId(),
    shop_id: kestrelId,
    name: KESTREL.dealer.name,
    contact_name: KESTREL.dealer.contactName,
    contact_email: KESTREL.dealer.contactEmail,
    phone: KESTREL.dealer.phone,
    created_at: daysAgo(200),
  });
  const dealerUserId = await user(KESTREL.dealer.user, 200);
  await member(kestrelId, dealerUserId, 'dealer', 200, dealer.id);
  const kCustomers: string[] = [];
  for (const [i, c] of KESTREL.customers.entries()) {
    const id = await user(c, 150 - i * 2);
    await member(kestrelId, id, 'customer', 150 - i * 2);
    kCustomers.push(id);
  }
  const kDealerCustomers: string[] = [];
  for (const [i, c] of KESTREL.dealerCustomers.entries()) {
    const id = await user(c, 120 - i * 30);
    await member(kestrelId, id, 'customer', 120 - i * 30, dealer.id);
    kDealerCustomers.push(id);
  }

  const harborId = (await insertShop(db, { id: newId(), name: HARBOR.name, currency: HARBOR.currency, slug: HARBOR.slug, description: HARBOR.description, public_page: 1, created_at: daysAgo(180) })).id;
  const hOwner = await user(HARBOR.owner, 180);
  await member(harborId, hOwner, 'owner', 180);
  const hTuners: string[] = [];
  for (const t of HARBOR.tuners) {
    const id = await user(t, 170);
    await member(harborId, id, 'tuner', 170);
    hTuners.push(id);
  }
  const hCustomers: string[] = [];
  for (const [i, c] of HARBOR.customers.entries()) {
    const id = await user(c, 90 - i * 5);
    await member(harborId, id, 'customer', 90 - i * 5);
    hCustomers.push(id);
  }

  const names = new Map<string, string>();
  for (const u of await db.selectFrom('users').select(['id', 'name']).execute()) names.set(u.id, u.name);
  const kestrel: SeededShop = {
    shopId: kestrelId,
    ownerId: kOwner,
    tunerIds: kTuners,
    customerIds: kCustomers,
    dealerId: dealer.id,
    dealerUserId,
    dealerCustomerIds: kDealerCustomers,
  };
  const harbor: SeededShop = { shopId: harborId, ownerId: hOwner, tunerIds: hTuners, customerIds: hCustomers, dealerId: null, dealerUserId: null, dealerCustomerIds: [] };
  const context = { db, blobs: options.blobs, now, customerNames: names };
  const jobs = [
    ...(await seedJobs(context, kestrel, { plan: 'kestrel', seed: 7, shopIndex: 0 })),
    ...(await seedJobs(context, harbor, { plan: 'harbor', seed: 11, shopIndex: 1 })),
  ];
  await leaveAFewUnread(db, now);
  await seedBilling(db, now, { kestrel, harbor }, jobs);
  await seedRentals(db, now, kestrel, jobs);
  await seedCustomers(db, kestrel);
  for (const shop of [kestrel, harbor]) await seedLogRequestDefaults(db, shop);
  return { adminId, kestrel, harbor, jobs };
}

/** Everyone has read their notifications up to the last few (two to five), as a person who checks the app daily would. */
async function leaveAFewUnread(db: Db, now: Date): Promise<void> {
  if (dialectOf(db) === 'postgres') {
    await sql`
      UPDATE notifications SET read_at = least(
        to_char((created_at::timestamptz + interval '40 minutes') at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'), ${now.toISOString()})
      WHERE id IN (
        SELECT id FROM (
          SELECT id, user_id, row_number() OVER (PARTITION BY shop_id, user_id ORDER BY created_at DESC) AS newest
          FROM notifications
        ) AS ranked WHERE newest > 2 + (ascii(right(user_id, 1)) % 4)
      )`.execute(db);
    return;
  }
  await sql`
    UPDATE notifications SET read_at = min(strftime('%Y-%m-%dT%H:%M:%fZ', created_at, '+40 minutes'), ${now.toISOString()})
    WHERE id IN (
      SELECT id FROM (
        SELECT id, user_id, row_number() OVER (PARTITION BY shop_id, user_id ORDER BY created_at DESC) AS newest
        FROM notifications
      ) WHERE newest > 2 + (unicode(substr(user_id, -1)) % 4)
    )`.execute(db);
}


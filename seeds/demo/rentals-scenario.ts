import { insertAuditEvent, insertKit, insertRental, insertRentalEntry, newId, type Db, type InsertableRentalRow, type KitRow } from '@revloop/db';
import type { JobState } from '@revloop/domain/jobs';
import { addDays, blockedRange, localDay, rentalFeeMinor, type KitStatus, type RentalEntryKind, type RentalState } from '@revloop/domain/rentals';
import type { SeededJob } from './jobs-scenario';
import type { SeededShop } from './seed-demo';

const DAY_MS = 86_400_000;
const SHIPPING_DAYS = 2;

const CONTENTS = ['Vehicle interface', 'Laptop with flashing and logging software', 'OBD-II cable', 'Battery supporter', 'Power supply'];

/** Invented kits, one in every status. */
const KITS: { name: string; serial: string; tag: string; status: KitStatus; platforms: string[]; notes: string }[] = [
  { name: 'Kit 1 — bench spare', serial: 'VI-40117', tag: 'LT-0101', status: 'available', platforms: ['2.0 turbo i4', 'v8'], notes: 'Good' },
  { name: 'Kit 2 — compact', serial: 'VI-40122', tag: 'LT-0102', status: 'booked', platforms: ['2.0 turbo i4'], notes: 'Good' },
  { name: 'Kit 3 — diesel', serial: 'VI-40135', tag: 'LT-0103', status: 'out', platforms: ['3.0 diesel i6'], notes: 'Small scratch on lid' },
  { name: 'Kit 4 — v8', serial: 'VI-40141', tag: 'LT-0104', status: 'out', platforms: ['v8'], notes: 'Good' },
  { name: 'Kit 5 — travel case', serial: 'VI-40150', tag: 'LT-0105', status: 'in_inspection', platforms: ['2.0 turbo i4', '3.0 turbo i6'], notes: 'Back from a rental, being checked' },
  { name: 'Kit 6 — older laptop', serial: 'VI-40163', tag: 'LT-0106', status: 'in_repair', platforms: ['v6'], notes: 'Laptop battery swells; replacement ordered' },
  { name: 'Kit 7 — first kit', serial: 'VI-39001', tag: 'LT-0090', status: 'retired', platforms: ['v8'], notes: 'Interface no longer supported' },
];

interface Plan {
  state: RentalState;
  kit: number | null;
  jobStates: JobState[];
  /** Start day relative to today, and length in days. */
  start: number;
  days: number;
}

/** One rental in every state, on Kestrel jobs whose own state fits it. */
const PLANS: Plan[] = [
  { state: 'requested', kit: null, jobStates: ['intake'], start: 5, days: 14 },
  { state: 'booked', kit: 1, jobStates: ['intake', 'ready'], start: 4, days: 14 },
  { state: 'shipped', kit: 2, jobStates: ['ready', 'on_bench'], start: 1, days: 14 },
  { state: 'with_customer', kit: 3, jobStates: ['with_customer'], start: -10, days: 8 }, // three days overdue
  { state: 'returned', kit: 4, jobStates: ['log_review', 'with_customer'], start: -20, days: 14 },
  { state: 'closed', kit: 0, jobStates: ['dialed_in'], start: -40, days: 14 },
  { state: 'cancelled', kit: 1, jobStates: ['cancelled'], start: -15, days: 7 },
];

/**
 * Kits and rentals for Kestrel. The payment stand-in forgets saved cards when it restarts, so demo deposits are
 * records only (no saved card): the hold sweep leaves them alone. Rentals avoid the first demo customer, whose
 * account the tests use for their own rentals.
 */
export async function seedRentals(db: Db, now: Date, shop: SeededShop, jobs: SeededJob[]): Promise<void> {
  const today = localDay(now, 'UTC');
  const at = (day: string, hour = 10) => `${day}T${String(hour).padStart(2, '0')}:00:00.000Z`;
  const created = new Date(now.getTime() - 120 * DAY_MS).toISOString();
  const kits: KitRow[] = [];
  for (const [i, k] of KITS.entries()) {
    kits.push(
      await insertKit(db, {
        id: newId(),
        shop_id: shop.shopId,
        name: k.name,
        interface_serial: k.serial,
        laptop_asset_tag: k.tag,
        contents: JSON.stringify(CONTENTS),
        platforms: JSON.stringify(k.platforms),
        condition_notes: k.notes,
        status: k.status,
        weekly_price_minor: 7500 + i * 500,
        deposit_minor: 40000,
        late_fee_per_day_minor: 2000,
        in_service_since: addDays(today, -120),
        retired_on: k.status === 'retired' ? addDays(today, -30) : null,
        created_at: created,
        updated_at: created,
      }),
    );
  }
  const used = new Set<string>();
  const kestrelJobs = jobs.filter((j) => j.shopId === shop.shopId && j.customerUserId !== shop.customerIds[0]);
  for (const plan of PLANS) {
    const job = kestrelJobs.find((j) => plan.jobStates.includes(j.state) && !used.has(j.id));
    if (!job) continue;
    used.add(job.id);
    const kit = plan.kit === null ? null : kits[plan.kit]!;
    const start = addDays(today, plan.start);
    const due = addDays(start, plan.days - 1);
    const blocked = blockedRange(start, due, SHIPPING_DAYS);
    const shippedOn = addDays(start, -SHIPPING_DAYS);
    const away = ['shipped', 'with_customer', 'returned', 'closed'].includes(plan.state);
    const row: InsertableRentalRow = {
      id: newId(),
      shop_id: shop.shopId,
      job_id: job.id,
      kit_id: kit?.id ?? null,
      customer_user_id: job.customerUserId,
      dealer_id: job.dealerId,
      state: plan.state,
      start_date: start,
      due_date: due,
      blocked_from: blocked.from,
      blocked_to: blocked.to,
      notes: plan.state === 'requested' ? 'No interface of my own; a laptop would help too.' : '',
      carrier: away ? 'DHL' : null,
      tracking_number: away ? `JD01460000${String(PLANS.indexOf(plan)).padStart(4, '0')}` : null,
      shipped_at: away ? at(shippedOn) : null,
      delivered_at: ['with_customer', 'returned', 'closed'].includes(plan.state) ? at(addDays(start, -1), 15) : null,
      received_date: plan.state === 'returned' || plan.state === 'closed' ? addDays(due, 1) : null,
      returned_contents: plan.state === 'returned' || plan.state === 'closed' ? JSON.stringify(CONTENTS.map((item) => ({ item, present: true }))) : null,
      condition: plan.state === 'returned' || plan.state === 'closed' ? 'good' : null,
      cancel_reason: plan.state === 'cancelled' ? 'Customer borrowed an interface from a friend' : '',
      terms_accepted_at: plan.state === 'requested' ? null : at(addDays(start, -7)),
      currency: 'USD',
      fee_minor: kit ? rentalFeeMinor(start, due, kit.weekly_price_minor) : 0,
      deposit_minor: kit?.deposit_minor ?? 0,
      late_fee_per_day_minor: kit?.late_fee_per_day_minor ?? 0,
      fee_paid_at: kit && plan.state !== 'cancelled' ? at(addDays(start, -6)) : null,
      deposit_status: plan.state === 'shipped' || plan.state === 'with_customer' || plan.state === 'returned' ? 'held' : plan.state === 'closed' ? 'released' : 'none',
      hold_minor: plan.state === 'shipped' || plan.state === 'with_customer' || plan.state === 'returned' ? (kit?.deposit_minor ?? 0) : 0,
      closed_at: plan.state === 'closed' ? at(addDays(due, 2)) : null,
      created_at: at(addDays(start, -10)),
      updated_at: at(addDays(start, -1)),
    };
    await insertRental(db, row);
    const line = async (kind: RentalEntryKind, amount: number, description: string, day: string) =>
      insertRentalEntry(db, { id: newId(), shop_id: shop.shopId, rental_id: row.id, kind, amount_minor: amount, description, provider_ref: null, at: at(day, 12) });
    if (row.fee_paid_at) await line('fee', row.fee_minor, 'Rental fee paid', addDays(start, -6));
    if (away) await line('hold_placed', row.deposit_minor, 'Deposit held on your card', shippedOn);
    if (plan.state === 'closed') await line('hold_released', row.deposit_minor, 'Deposit hold released: kit returned in good condition', addDays(due, 2));
    if (kit) {
      const text = `${plan.state === 'requested' ? 'Kit asked for' : `Kit ${plan.state.replace('_', ' ')}`} on job ${job.number}`;
      await insertAuditEvent(db, { id: newId(), shop_id: shop.shopId, actor_user_id: shop.ownerId, action: `rental.${plan.state}`, subject_type: 'Kit', subject_id: kit.id, details: JSON.stringify({ rentalId: row.id, jobId: job.id, text }), created_at: row.updated_at! });
    }
  }
}

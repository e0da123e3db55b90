import { claimRentalReminder, findJob, findRental, findShopById, listAwayRentals, listMembers, type RentalRow } from '@revloop/db';
import { formatMoney } from '@revloop/domain/billing';
import { daysBetween, lateDays, localDay, type RentalState } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { customerSideOf, jobLink, shopSideOf } from '../jobs/job.service';
import { notify } from '../notifications/notify.service';
import { renewHolds } from './rental-money';
import { shopRentalSettings } from './rental-records';

type NoticeDeps = Pick<AppDeps, 'db' | 'clock' | 'mailer' | 'env' | 'logger'>;

const RETURN_CAUTION = 'Pack every item on the checklist, keep the receipt of the return shipment, and send the kit back by the due date.';

/** Tells the other side of a rental's move: the shop of a request, the customer of everything else. */
export async function notifyRental(deps: NoticeDeps, rentalId: string, shopId: string, to: RentalState): Promise<void> {
  const row = await findRental(deps.db, shopId, rentalId);
  const job = row && (await findJob(deps.db, shopId, row.job_id));
  if (!row || !job) return;
  const kit = row.kit_name ?? 'the kit';
  const text: Partial<Record<RentalState, [string, string]>> = {
    requested: [`Kit asked for on job ${job.number}`, `${row.customer_name} asks for a kit from ${row.start_date} to ${row.due_date}: pick one and book it.`],
    booked: [`Kit booked for job ${job.number}`, `${kit} is booked for you from ${row.start_date} to ${row.due_date}. Agree to the rental terms, pay the fee and save the card for the deposit hold so it can ship.`],
    shipped: [`Your kit is on its way (job ${job.number})`, `${kit} shipped with ${row.carrier}, tracking ${row.tracking_number}. Return it by ${row.due_date}.`],
    returned: [`Kit received back (job ${job.number})`, `The shop received ${kit} back and is checking it.`],
    closed: [`Kit rental closed (job ${job.number})`, 'The rental is settled: see the money lines on the job page for what was released or taken, and why.'],
    cancelled: [`Kit rental cancelled (job ${job.number})`, `The rental of ${kit} from ${row.start_date} to ${row.due_date} is cancelled.`],
  };
  const message = text[to];
  if (!message) return;
  const recipients = to === 'requested' ? await shopSideOf(deps.db, job) : await customerSideOf(deps.db, job);
  if (to === 'shipped') {
    // The shipped notice is a reminder of its own: claimed once, so a replayed move cannot send it twice.
    if (!(await claimRentalReminder(deps.db, { rental_id: row.id, kind: 'shipped', day: row.due_date, shop_id: shopId, sent_at: deps.clock.now().toISOString() }))) return;
  }
  await notify(deps.db, deps.mailer, {
    shopId,
    jobId: job.id,
    kind: 'kit_rental',
    recipients,
    title: message[0],
    body: message[1],
    ...(to === 'shipped' && { emailLines: ['', RETURN_CAUTION] }),
    link: jobLink(deps.env.APP_ORIGIN, job.id),
    at: deps.clock.now(),
  });
}

export interface SweepResult {
  holdsRenewed: number;
  remindersSent: number;
}

/** The reminders due for one rental today, in the shop's zone: [kind, day it is for]. */
export function remindersDue(row: Pick<RentalRow, 'due_date'>, today: string, overdueLimit: number): { kind: 'due_soon' | 'due_today' | 'overdue' | 'overdue_owner'; day: string }[] {
  const until = daysBetween(today, row.due_date);
  const late = lateDays(row.due_date, today);
  const due: { kind: 'due_soon' | 'due_today' | 'overdue' | 'overdue_owner'; day: string }[] = [];
  if (until === 2) due.push({ kind: 'due_soon', day: row.due_date });
  if (until === 0) due.push({ kind: 'due_today', day: row.due_date });
  if (late > 0 && late <= overdueLimit) due.push({ kind: 'overdue', day: today });
  if (late > 0) due.push({ kind: 'overdue_owner', day: today });
  return due;
}

/**
 * Run hourly by the server (and by tests on the test clock): re-places lapsing deposit holds and sends the day's
 * reminders. Each reminder is claimed in rental_reminders before it is sent, so running twice sends nothing twice.
 */
export async function runRentalSweep(deps: NoticeDeps): Promise<SweepResult> {
  const rows = await listAwayRentals(deps.db);
  const holdsRenewed = await renewHolds(deps, rows);
  let remindersSent = 0;
  const now = deps.clock.now();
  for (const row of rows) {
    const shop = await findShopById(deps.db, row.shop_id);
    const job = await findJob(deps.db, row.shop_id, row.job_id);
    if (!shop || !job) continue;
    const { timeZone, overdueReminderLimit } = shopRentalSettings(shop.settings);
    const today = localDay(now, timeZone);
    const late = lateDays(row.due_date, today);
    for (const reminder of remindersDue(row, today, overdueReminderLimit)) {
      if (!(await claimRentalReminder(deps.db, { rental_id: row.id, kind: reminder.kind, day: reminder.day, shop_id: row.shop_id, sent_at: now.toISOString() }))) continue;
      const owners = reminder.kind === 'overdue_owner' ? (await listMembers(deps.db, row.shop_id, { role: 'owner' })).filter((m) => m.status === 'active').map((m) => m.user_id) : [];
      const texts: Record<typeof reminder.kind, [string, string]> = {
        due_soon: [`Kit due back in 2 days (job ${job.number})`, `Please send the kit back by ${row.due_date}. ${RETURN_CAUTION}`],
        due_today: [`Kit due back today (job ${job.number})`, `The kit is due back today, ${row.due_date}. ${RETURN_CAUTION}`],
        overdue: [`Kit overdue by ${late} day${late === 1 ? '' : 's'} (job ${job.number})`, `The kit was due back on ${row.due_date}. Late days are charged at ${formatMoney(row.late_fee_per_day_minor, row.currency)} a day: please send it back now.`],
        overdue_owner: [`Overdue kit on job ${job.number}`, `The kit on job ${job.number} was due back on ${row.due_date} and is ${late} day${late === 1 ? '' : 's'} late.`],
      };
      const [title, body] = texts[reminder.kind];
      await notify(deps.db, deps.mailer, {
        shopId: row.shop_id,
        jobId: job.id,
        kind: 'kit_rental',
        recipients: reminder.kind === 'overdue_owner' ? owners : await customerSideOf(deps.db, job),
        title,
        body,
        link: jobLink(deps.env.APP_ORIGIN, job.id),
        at: now,
      });
      remindersSent += 1;
    }
  }
  return { holdsRenewed, remindersSent };
}

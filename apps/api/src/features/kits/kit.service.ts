import { findKit, findKitClashes, insertKit, listAuditEvents, listKitPhotos, listKits, listRentals, listShopRentalEntries, newId, updateKit, type Db, type KitPhotoRow, type KitRow } from '@revloop/db';
import type { Kit, KitCalendar, KitPhoto, KitCreate, KitDetail, KitOverview, KitPatch } from '@revloop/contract';
import { asSubject } from '@revloop/domain/auth';
import { addDays, daysBetween, daysInRange, intersectRanges, KIT_AWAY_STATES, localDay, mergeRanges, type DayRange } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { rentalSubject, shopRentalSettings, type ShopAuth } from '../rentals/rental-records';
import { lateDaysOf, summaryOf } from '../rentals/rental.service';
import { DomainError } from '@revloop/domain';

export function presentKit(row: KitRow, currency: string): Kit {
  return {
    id: row.id,
    name: row.name,
    interfaceSerial: row.interface_serial,
    laptopAssetTag: row.laptop_asset_tag,
    contents: JSON.parse(row.contents) as string[],
    platforms: JSON.parse(row.platforms) as string[],
    conditionNotes: row.condition_notes,
    status: row.status,
    weeklyPriceMinor: row.weekly_price_minor,
    depositMinor: row.deposit_minor,
    lateFeePerDayMinor: row.late_fee_per_day_minor,
    currency,
    inServiceSince: row.in_service_since,
    createdAt: row.created_at,
  };
}

export const presentKitPhoto = (row: KitPhotoRow): KitPhoto => ({
  id: row.id,
  url: `/api/kits/${row.kit_id}/photos/${row.id}`,
  contentType: row.content_type,
  originalName: row.original_name,
  sizeBytes: row.size_bytes,
  createdAt: row.created_at,
});

/** The kit if this viewer may read it; another shop's id answers 404. */
export async function loadKit(db: Db, auth: ShopAuth, id: string): Promise<KitRow> {
  const row = await findKit(db, auth.shop.id, id);
  authorizeRow(auth, 'read', 'Kit', row && { shopId: row.shop_id }, 'Kit not found.');
  return row!;
}

export async function createKit(deps: AppDeps, auth: ShopAuth, input: KitCreate): Promise<KitRow> {
  authorize(auth, 'create', 'Kit');
  const now = deps.clock.now();
  const at = now.toISOString();
  return writeWithAudit(
    deps.db,
    (trx) =>
      insertKit(trx, {
        id: newId(),
        shop_id: auth.shop.id,
        name: input.name,
        interface_serial: input.interfaceSerial,
        laptop_asset_tag: input.laptopAssetTag,
        contents: JSON.stringify(input.contents),
        platforms: JSON.stringify(input.platforms),
        condition_notes: input.conditionNotes,
        status: input.status,
        weekly_price_minor: input.weeklyPriceMinor,
        deposit_minor: input.depositMinor,
        late_fee_per_day_minor: input.lateFeePerDayMinor,
        in_service_since: localDay(now, shopRentalSettings(auth.shop.settings).timeZone),
        retired_on: null,
        created_at: at,
        updated_at: at,
      }),
    (row) => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: 'kit.created', subjectType: 'Kit', subjectId: row.id, details: { text: `Kit ${row.name} added` }, at: now }),
  );
}

export async function patchKit(deps: AppDeps, auth: ShopAuth, id: string, input: KitPatch): Promise<KitRow> {
  const kit = await loadKit(deps.db, auth, id);
  authorizeRow(auth, 'update', 'Kit', { shopId: kit.shop_id }, 'Kit not found.');
  const now = deps.clock.now();
  const today = localDay(now, shopRentalSettings(auth.shop.settings).timeZone);
  const changed = Object.keys(input).join(', ');
  const updated = await writeWithAudit(
    deps.db,
    (trx) =>
      updateKit(trx, auth.shop.id, kit.id, {
        ...(input.name !== undefined && { name: input.name }),
        ...(input.interfaceSerial !== undefined && { interface_serial: input.interfaceSerial }),
        ...(input.laptopAssetTag !== undefined && { laptop_asset_tag: input.laptopAssetTag }),
        ...(input.contents !== undefined && { contents: JSON.stringify(input.contents) }),
        ...(input.platforms !== undefined && { platforms: JSON.stringify(input.platforms) }),
        ...(input.conditionNotes !== undefined && { condition_notes: input.conditionNotes }),
        ...(input.status !== undefined && { status: input.status, retired_on: input.status === 'retired' ? today : null }),
        ...(input.weeklyPriceMinor !== undefined && { weekly_price_minor: input.weeklyPriceMinor }),
        ...(input.depositMinor !== undefined && { deposit_minor: input.depositMinor }),
        ...(input.lateFeePerDayMinor !== undefined && { late_fee_per_day_minor: input.lateFeePerDayMinor }),
        updated_at: now.toISOString(),
      }),
    () => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: 'kit.updated', subjectType: 'Kit', subjectId: kit.id, details: { text: `Kit changed: ${changed}${input.status ? ` (now ${input.status.replace('_', ' ')})` : ''}` }, at: now }),
  );
  return updated!;
}

export async function kitDetail(deps: AppDeps, auth: ShopAuth, id: string): Promise<KitDetail> {
  const kit = await loadKit(deps.db, auth, id);
  // The history names customers and jobs: staff only (the same people who may read every rental).
  if (!auth.ability.can('read', asSubject('Rental', { shopId: kit.shop_id, customerUserId: null, dealerId: null }))) throw new DomainError('not_found', 'Kit not found.');
  const events = await listAuditEvents(deps.db, auth.shop.id, { subjectType: 'Kit', subjectId: kit.id, limit: 50 });
  return {
    ...presentKit(kit, auth.shop.currency),
    photos: (await listKitPhotos(deps.db, auth.shop.id, kit.id)).map(presentKitPhoto),
    history: events.map((e) => {
      const details = JSON.parse(e.details) as { text?: string; rentalId?: string };
      return { at: e.created_at, action: e.action, summary: details.text ?? e.action, rentalId: details.rentalId ?? null };
    }),
  };
}

const MAX_RANGE_DAYS = 366;
const checkRange = (range: DayRange) => {
  if (daysInRange(range) > MAX_RANGE_DAYS) throw new DomainError('validation', `to: Ask for at most ${MAX_RANGE_DAYS} days at a time.`);
};

/** GET /api/kits/:id/bookings: busy days for everyone; the bookings themselves only where the viewer may read them. */
export async function kitCalendar(deps: AppDeps, auth: ShopAuth, id: string, range: DayRange): Promise<KitCalendar> {
  checkRange(range);
  const kit = await loadKit(deps.db, auth, id);
  const rows = await findKitClashes(deps.db, auth.shop.id, kit.id, range.from, range.to);
  const busy = mergeRanges(rows.flatMap((r) => intersectRanges({ from: r.blocked_from, to: r.blocked_to }, range) ?? []));
  const visible = rows.filter((r) => auth.actor.role === 'owner' || auth.actor.role === 'tuner' ? auth.ability.can('read', asSubject('Rental', rentalSubject(r))) : false);
  return {
    kitId: kit.id,
    from: range.from,
    to: range.to,
    busy,
    bookings: visible.map((r) => ({ rentalId: r.id, jobId: r.job_id, customerName: r.customer_name, state: r.state, startDate: r.start_date, dueDate: r.due_date, blocked: { from: r.blocked_from, to: r.blocked_to } })),
    shippingDays: shopRentalSettings(auth.shop.settings).shippingDays,
  };
}

/** GET /api/kits/overview (owner): what is out, due and overdue today, and each kit's use and revenue over from..to. */
export async function kitOverview(deps: AppDeps, auth: ShopAuth, range: DayRange): Promise<KitOverview> {
  checkRange(range);
  authorize(auth, 'update', 'Kit');
  const { timeZone } = shopRentalSettings(auth.shop.settings);
  const now = deps.clock.now();
  const today = localDay(now, timeZone);
  const kits = await listKits(deps.db, auth.shop.id, { includeRetired: true });
  const rentals = await listRentals(deps.db, auth.shop.id, { kind: 'shop' });
  const away = rentals.filter((r) => (KIT_AWAY_STATES as readonly string[]).includes(r.state));
  // Revenue counts money lines whose instant falls within the range's shop-local days (UTC bounds a day either side).
  const entries = await listShopRentalEntries(deps.db, auth.shop.id, `${addDays(range.from, -1)}T00:00:00.000Z`, `${addDays(range.to, 2)}T00:00:00.000Z`);
  const revenueKinds = new Set(['fee', 'late_fee', 'capture']);
  return {
    from: range.from,
    to: range.to,
    today,
    outNow: away.map((r) => summaryOf(r, today)),
    dueThisWeek: away.filter((r) => daysBetween(today, r.due_date) >= 0 && daysBetween(today, r.due_date) < 7).map((r) => summaryOf(r, today)),
    overdue: away.filter((r) => lateDaysOf(r, today) > 0).map((r) => summaryOf(r, today)),
    kits: kits.map((kit) => {
      const service = intersectRanges({ from: kit.in_service_since, to: kit.retired_on ?? range.to }, { from: range.from, to: today < range.to ? today : range.to });
      const daysInService = service ? daysInRange(service) : 0;
      const daysOut = service
        ? rentals
            .filter((r) => r.kit_id === kit.id && r.shipped_at)
            .reduce((sum, r) => {
              const out = intersectRanges({ from: localDay(new Date(r.shipped_at!), timeZone), to: r.received_date ?? today }, service);
              return sum + (out ? daysInRange(out) : 0);
            }, 0)
        : 0;
      const revenueMinor = entries
        .filter((e) => e.kit_id === kit.id && revenueKinds.has(e.kind))
        .filter((e) => {
          const day = localDay(new Date(e.at), timeZone);
          return day >= range.from && day <= range.to;
        })
        .reduce((sum, e) => sum + e.amount_minor, 0);
      return { kitId: kit.id, name: kit.name, status: kit.status, daysOut: Math.min(daysOut, daysInService), daysInService, utilisation: daysInService > 0 ? Math.min(daysOut, daysInService) / daysInService : null, revenueMinor };
    }),
    currency: auth.shop.currency,
  };
}

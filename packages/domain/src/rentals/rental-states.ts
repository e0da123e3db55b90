/** Rental states in the order a rental normally moves through them (docs/glossary.md, "rental"). */
export const RENTAL_STATES = [
  'requested',
  'booked',
  'shipped',
  'with_customer',
  'returned',
  'closed',
  'cancelled',
] as const;
export type RentalState = (typeof RENTAL_STATES)[number];

export const RENTAL_STATE_LABELS: Record<RentalState, string> = {
  requested: 'Requested',
  booked: 'Booked',
  shipped: 'Shipped',
  with_customer: 'With customer',
  returned: 'Returned',
  closed: 'Closed',
  cancelled: 'Cancelled',
};

/** States in which the kit is away from the shop (it counts as out for the job's dialed-in guard). */
export const KIT_AWAY_STATES = ['shipped', 'with_customer'] as const satisfies readonly RentalState[];

/** States that hold the kit's dates: a booking in one of these blocks other bookings of the kit. */
export const BLOCKING_STATES = ['booked', 'shipped', 'with_customer'] as const satisfies readonly RentalState[];

export const KIT_STATUSES = ['available', 'booked', 'out', 'in_inspection', 'in_repair', 'retired'] as const;
export type KitStatus = (typeof KIT_STATUSES)[number];

export const KIT_STATUS_LABELS: Record<KitStatus, string> = {
  available: 'Available',
  booked: 'Booked',
  out: 'Out',
  in_inspection: 'In inspection',
  in_repair: 'In repair',
  retired: 'Retired',
};

export const RETURN_CONDITIONS = ['good', 'damaged', 'missing_items', 'lost'] as const;
export type ReturnCondition = (typeof RETURN_CONDITIONS)[number];

/** Money lines of a rental, each one the customer sees and the shop exports. */
export const RENTAL_ENTRY_KINDS = [
  'fee',
  'card_saved',
  'hold_placed',
  'hold_released',
  'hold_lapsed',
  'capture',
  'late_fee',
] as const;
export type RentalEntryKind = (typeof RENTAL_ENTRY_KINDS)[number];

/** The plain name of each money line, shown to the customer on the job page and in the shop's money export. */
export const RENTAL_ENTRY_LABELS: Record<RentalEntryKind, string> = {
  fee: 'Rental fee paid',
  card_saved: 'Card saved for the deposit',
  hold_placed: 'Deposit hold placed',
  hold_released: 'Deposit hold released',
  hold_lapsed: 'Deposit hold lapsed (placed again)',
  capture: 'Taken from the deposit',
  late_fee: 'Late fee',
};

/** Where the deposit stands: nothing yet, card saved for a later hold, held on the card, released or captured. */
export const DEPOSIT_STATUSES = ['none', 'card_saved', 'held', 'released', 'captured', 'lapsed'] as const;
export type DepositStatus = (typeof DEPOSIT_STATUSES)[number];

/** The shop's rental settings with their defaults filled in (shop settings keep them optional). */
export const rentalSettings = (settings: { rentalShippingDays?: number; rentalOverdueReminderLimit?: number }) => ({
  shippingDays: settings.rentalShippingDays ?? 2,
  overdueReminderLimit: settings.rentalOverdueReminderLimit ?? 5,
});

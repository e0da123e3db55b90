import {
  DEPOSIT_STATUSES,
  KIT_STATUSES,
  RENTAL_ENTRY_KINDS,
  RENTAL_STATES,
  RETURN_CONDITIONS,
} from '@revloop/domain/rentals';
import { moneyMinorSchema } from '@revloop/domain/billing';
import { z } from 'zod';

// Flashing-kit rentals (issue 14). Dates are shop-local calendar days `YYYY-MM-DD`; money is integer minor units in the
// shop's currency. Every response is wrapped as `{ data }`. Routes: docs/api/rentals.md.

/** A shop-local calendar day, ISO 8601 `YYYY-MM-DD`. */
export const isoDaySchema = z.iso.date('Use a date written YYYY-MM-DD.');
const minor = moneyMinorSchema;
const shortText = (max: number) => z.string().trim().max(max, `Keep this under ${max} characters.`);
const idSchema = z.string().trim().min(1);

export const kitStatusSchema = z.enum(KIT_STATUSES);
export const rentalStateSchema = z.enum(RENTAL_STATES);
export const returnConditionSchema = z.enum(RETURN_CONDITIONS);
export const rentalEntryKindSchema = z.enum(RENTAL_ENTRY_KINDS);
export const depositStatusSchema = z.enum(DEPOSIT_STATUSES);

// ---------- kits ----------

const kitFields = {
  name: shortText(120).min(1, 'Name the kit.'),
  interfaceSerial: shortText(80).min(1, "Enter the interface's serial number."),
  laptopAssetTag: shortText(80),
  /** What goes in the box, checked off on return. */
  contents: z.array(shortText(120).min(1)).max(50),
  /** Platforms the kit serves: free text or engine families. */
  platforms: z.array(shortText(80).min(1)).max(50),
  conditionNotes: shortText(2000),
  status: kitStatusSchema,
  weeklyPriceMinor: minor,
  depositMinor: minor,
  lateFeePerDayMinor: minor,
};

/** POST /api/kits. */
export const kitCreateSchema = z.object({
  ...kitFields,
  laptopAssetTag: kitFields.laptopAssetTag.default(''),
  contents: kitFields.contents.default([]),
  platforms: kitFields.platforms.default([]),
  conditionNotes: kitFields.conditionNotes.default(''),
  status: kitFields.status.default('available'),
});
export type KitCreate = z.infer<typeof kitCreateSchema>;

/** PATCH /api/kits/:id: any field of the create body. */
export const kitPatchSchema = z.object(kitFields).partial();
export type KitPatch = z.infer<typeof kitPatchSchema>;

export const kitSchema = z.object({
  id: z.string(),
  name: z.string(),
  interfaceSerial: z.string(),
  laptopAssetTag: z.string(),
  contents: z.array(z.string()),
  platforms: z.array(z.string()),
  conditionNotes: z.string(),
  status: kitStatusSchema,
  weeklyPriceMinor: z.number().int(),
  depositMinor: z.number().int(),
  lateFeePerDayMinor: z.number().int(),
  currency: z.string(),
  /** The first day the kit could be rented (its creation day in the shop's time zone). */
  inServiceSince: isoDaySchema,
  createdAt: z.string(),
});
export type Kit = z.infer<typeof kitSchema>;

/** `?from&to` of GET /api/kits/:id/bookings and GET /api/kits/overview (inclusive days, at most 366 apart). */
export const dayRangeQuerySchema = z
  .object({ from: isoDaySchema, to: isoDaySchema })
  .refine((q) => q.from <= q.to, { message: 'The range ends before it starts.', path: ['to'] });
export type DayRangeQuery = z.infer<typeof dayRangeQuerySchema>;

export const dayRangeSchema = z.object({ from: isoDaySchema, to: isoDaySchema });
export type DayRange = z.infer<typeof dayRangeSchema>;

/** One booking on a kit's calendar, shown to shop staff only. */
export const kitBookingSchema = z.object({
  rentalId: z.string(),
  jobId: z.string(),
  customerName: z.string(),
  state: rentalStateSchema,
  startDate: isoDaySchema,
  dueDate: isoDaySchema,
  /** The days the kit is unavailable: the rental plus the shop's shipping days before and after. */
  blocked: dayRangeSchema,
});
export type KitBooking = z.infer<typeof kitBookingSchema>;

/** GET /api/kits/:id/bookings: customers get only `busy` (bookings is empty); staff get both. */
export const kitCalendarSchema = z.object({
  kitId: z.string(),
  from: isoDaySchema,
  to: isoDaySchema,
  /** Merged inclusive day ranges in which the kit cannot be booked, clipped to from..to. */
  busy: z.array(dayRangeSchema),
  bookings: z.array(kitBookingSchema),
  /** Shipping days the shop adds before the start and after the due date of every booking. */
  shippingDays: z.number().int(),
});
export type KitCalendar = z.infer<typeof kitCalendarSchema>;

/** One line of the kit's history (GET /api/kits/:id includes the last 50). */
export const kitHistoryItemSchema = z.object({
  at: z.string(),
  action: z.string(),
  summary: z.string(),
  rentalId: z.string().nullable(),
});

/** A photo of a kit (optional); the image is at `url`. */
export const kitPhotoSchema = z.object({
  id: z.string(),
  url: z.string(),
  contentType: z.string(),
  originalName: z.string(),
  sizeBytes: z.number().int(),
  createdAt: z.string(),
});
export type KitPhoto = z.infer<typeof kitPhotoSchema>;

export const kitDetailSchema = kitSchema.extend({ history: z.array(kitHistoryItemSchema), photos: z.array(kitPhotoSchema) });
export type KitDetail = z.infer<typeof kitDetailSchema>;

/** GET /api/kits/overview?from&to (owner). */
export const kitOverviewSchema = z.object({
  from: isoDaySchema,
  to: isoDaySchema,
  today: isoDaySchema,
  outNow: z.array(z.lazy(() => rentalSummarySchema)),
  dueThisWeek: z.array(z.lazy(() => rentalSummarySchema)),
  overdue: z.array(z.lazy(() => rentalSummarySchema)),
  kits: z.array(
    z.object({
      kitId: z.string(),
      name: z.string(),
      status: kitStatusSchema,
      /** Days the kit was away (shipped to returned) within from..to. */
      daysOut: z.number().int(),
      /** Days within from..to since it was put in service and not retired. */
      daysInService: z.number().int(),
      /** daysOut ÷ daysInService, 0..1; null with no days in service. */
      utilisation: z.number().nullable(),
      /** Rental fees paid plus late fees and captures taken in from..to. */
      revenueMinor: z.number().int(),
    }),
  ),
  currency: z.string(),
});
export type KitOverview = z.infer<typeof kitOverviewSchema>;

// ---------- rentals ----------

/**
 * POST /api/rentals. Staff (owner, tuner) send a kitId and the rental is booked at once (409 `rental_clash` when
 * the kit is taken). A customer or dealer asks without a kitId: the rental is requested and the shop picks the kit.
 */
export const rentalCreateSchema = z
  .object({
    jobId: idSchema,
    kitId: idSchema.optional(),
    startDate: isoDaySchema,
    dueDate: isoDaySchema,
    notes: shortText(1000).default(''),
  })
  .refine((r) => r.startDate <= r.dueDate, { message: 'The due date is before the start date.', path: ['dueDate'] });
export type RentalCreate = z.infer<typeof rentalCreateSchema>;

/** `?jobId&kitId&state` of GET /api/rentals. */
export const rentalListQuerySchema = z.object({
  jobId: idSchema.optional(),
  kitId: idSchema.optional(),
  state: rentalStateSchema.optional(),
});
export type RentalListQuery = z.input<typeof rentalListQuerySchema>;

const returnedItemSchema = z.object({ item: shortText(120).min(1), present: z.boolean() });

/** POST /api/rentals/:id/transitions: `to` plus the fields that move needs. */
export const rentalTransitionSchema = z.discriminatedUnion('to', [
  /** The shop picks the kit (and may adjust the dates) for a requested rental. */
  z.object({
    to: z.literal('booked'),
    kitId: idSchema,
    startDate: isoDaySchema.optional(),
    dueDate: isoDaySchema.optional(),
  }),
  z.object({
    to: z.literal('shipped'),
    carrier: shortText(80).min(1, 'Name the carrier.'),
    trackingNumber: shortText(80).min(1, 'Enter the tracking number.'),
  }),
  z.object({ to: z.literal('with_customer') }),
  z.object({
    to: z.literal('returned'),
    receivedDate: isoDaySchema,
    contents: z.array(returnedItemSchema).max(50),
    condition: returnConditionSchema,
    conditionNotes: shortText(2000).default(''),
  }),
  /**
   * Closing settles the deposit: with no capture the hold is released; a capture takes part or all of the hold with
   * a reason the customer sees and releases the rest. Late days are charged at the kit's daily fee unless waived.
   */
  z.object({
    to: z.literal('closed'),
    capture: z.object({ amountMinor: minor.min(1), reason: shortText(500).min(1, 'Say why the deposit is taken.') }).optional(),
    waiveLateFee: z.boolean().default(false),
  }),
  z.object({ to: z.literal('cancelled'), reason: shortText(500).default('') }),
]);
export type RentalTransition = z.infer<typeof rentalTransitionSchema>;

/** POST /api/rentals/:id/terms: the customer agrees to what happens if the kit is late, damaged or lost. */
export const rentalTermsSchema = z.object({ accept: z.literal(true, 'Tick the box to agree to the rental terms.') });

export const rentalEntrySchema = z.object({
  id: z.string(),
  kind: rentalEntryKindSchema,
  /** Money moved or held by this line; 0 for card_saved. */
  amountMinor: z.number().int(),
  /** Plain words the customer sees (e.g. the capture reason, "3 late days × 15.00"). */
  description: z.string(),
  at: z.string(),
});
export type RentalEntry = z.infer<typeof rentalEntrySchema>;

export const rentalSummarySchema = z.object({
  id: z.string(),
  jobId: z.string(),
  kitId: z.string().nullable(),
  kitName: z.string().nullable(),
  customerName: z.string(),
  state: rentalStateSchema,
  startDate: isoDaySchema,
  dueDate: isoDaySchema,
  /** Whole days late counted in the shop's time zone (0 if not late). */
  lateDays: z.number().int(),
});
export type RentalSummary = z.infer<typeof rentalSummarySchema>;

export const rentalSchema = rentalSummarySchema.extend({
  customerUserId: z.string(),
  notes: z.string(),
  /** The kit's unavailable days: start and due widened by the shop's shipping days. */
  blocked: dayRangeSchema,
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  shippedAt: z.string().nullable(),
  deliveredAt: z.string().nullable(),
  receivedDate: isoDaySchema.nullable(),
  returnedContents: z.array(returnedItemSchema).nullable(),
  condition: returnConditionSchema.nullable(),
  conditionNotes: z.string(),
  cancelReason: z.string(),
  termsAcceptedAt: z.string().nullable(),
  currency: z.string(),
  /** Rental fee: whole weeks rounded up × the kit's weekly price, fixed at booking. */
  feeMinor: z.number().int(),
  feePaid: z.boolean(),
  depositMinor: z.number().int(),
  lateFeePerDayMinor: z.number().int(),
  deposit: z.object({
    status: depositStatusSchema,
    heldMinor: z.number().int(),
    /** When the current hold lapses unless re-placed (ISO time), null with no hold. */
    holdExpiresAt: z.string().nullable(),
  }),
  entries: z.array(rentalEntrySchema),
  /** Moves this user can make now. */
  availableTransitions: z.array(z.object({ to: rentalStateSchema, label: z.string() })),
  /** One sentence for the job page and the customer's next step ("Kit ships on …", "Return the kit by …"). */
  nextStep: z.string(),
  createdAt: z.string(),
});
export type Rental = z.infer<typeof rentalSchema>;

/** POST /api/rentals/:id/fee/checkout and /deposit/checkout: where to send the customer. */
export const rentalCheckoutSchema = z.object({ url: z.string(), sessionId: z.string() });
export type RentalCheckout = z.infer<typeof rentalCheckoutSchema>;

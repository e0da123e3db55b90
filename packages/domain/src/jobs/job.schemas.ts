import { z } from 'zod';
import { moneyMinorSchema } from '../billing/money';
import { tyreSizeSchema, vehicleInputSchema } from '../vehicles/vehicle.schemas';
import { nameSchema } from '../text/name-text.rules';

const id = (what: string) => z.string().trim().min(1, `Choose ${what}.`);
const notes = z.string().trim().max(1000, 'Keep notes under 1000 characters.').default('');
const rpm = (what: string) =>
  z
    .number()
    .int(`${what} is a whole rpm.`)
    .min(500, `${what} is at least 500 rpm.`)
    .max(12000, `${what} is at most 12000 rpm.`);

export const jobCustomerSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('existing'), customerUserId: id('a customer') }),
  z.object({
    kind: z.literal('new'),
    name: nameSchema(1, 120, "Enter the customer's name."),
    email: z.email('Enter a valid email address.'),
  }),
]);

export const jobVehicleSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('existing'), vehicleId: id('a vehicle') }),
  z.object({ kind: z.literal('new'), vehicle: vehicleInputSchema }),
]);

/** Changes the customer asks for beyond the package's usual work; each is optional. */
export const specialRequestsSchema = z.object({
  shiftPoints: z.object({ rpm: rpm('Shift point').optional(), notes }).optional(),
  revLimit: z.object({ rpm: rpm('Rev limit').optional(), notes }).optional(),
  speedLimiter: z
    .object({
      kmh: z
        .number()
        .min(30, 'Speed limit is at least 30 km/h.')
        .max(400, 'Speed limit is at most 400 km/h.')
        .optional(),
      notes,
    })
    .optional(),
  tyreOrGearChange: z
    .object({
      tyreSize: tyreSizeSchema.optional(),
      finalDrive: z.number().min(1.5).max(7).optional(),
      notes,
    })
    .optional(),
  launch: z.object({ rpm: rpm('Launch rpm').optional(), notes }).optional(),
  idle: z.object({ rpm: rpm('Idle speed').optional(), notes }).optional(),
});

/** A kit asked for at intake: shop-local calendar days `YYYY-MM-DD`, both inclusive. */
export const kitRequestSchema = z
  .object({
    startDate: z.iso.date('Use a date written YYYY-MM-DD.'),
    dueDate: z.iso.date('Use a date written YYYY-MM-DD.'),
    notes: z.string().trim().max(1000, 'Keep this under 1000 characters.').default(''),
  })
  .refine((r) => r.startDate <= r.dueDate, { message: 'The due date is before the start date.', path: ['dueDate'] });
export type KitRequestInput = z.infer<typeof kitRequestSchema>;

export const jobIntakeSchema = z.object({
  customer: jobCustomerSchema,
  vehicle: jobVehicleSchema,
  packageId: id('a package'),
  goals: z
    .string()
    .trim()
    .min(1, 'Describe what the customer wants from the calibration.')
    .max(4000),
  specialRequests: specialRequestsSchema.default({}),
  cautionsAccepted: z.literal(true, 'The customer must accept the cautions before the job opens.'),
  /** "I need a flashing kit": the job opens with a kit rental asked for these dates; the shop picks the kit. */
  kitRequest: kitRequestSchema.optional(),
});
export type JobIntakeInput = z.infer<typeof jobIntakeSchema>;
export type JobIntakeFormValues = z.input<typeof jobIntakeSchema>;

/** Control units a package can cover (SAE J1930 names). */
export const PACKAGE_MODULES = ['ECM', 'TCM'] as const;
export type PackageModule = (typeof PACKAGE_MODULES)[number];

export const packageInputSchema = z
  .object({
    name: nameSchema(1, 80, 'Name the package.'),
    description: z.string().trim().max(2000).default(''),
    modules: z
      .array(z.enum(PACKAGE_MODULES))
      .min(1, 'A package covers at least one module.')
      .refine((modules) => new Set(modules).size === modules.length, 'List each module once.'),
    retailPriceMinor: moneyMinorSchema,
    dealerPriceMinor: moneyMinorSchema,
    roundsIncluded: z
      .number()
      .int()
      .min(1, 'Include at least one round.')
      .max(20, 'At most 20 rounds.'),
  })
  .refine((pkg) => pkg.dealerPriceMinor <= pkg.retailPriceMinor, {
    path: ['dealerPriceMinor'],
    message: 'The dealer price cannot be above the retail price.',
  });
export type PackageInput = z.infer<typeof packageInputSchema>;

export const messageInputSchema = z.object({
  body: z
    .string()
    .trim()
    .min(1, 'Write a message.')
    .max(5000, 'Keep a message under 5000 characters.'),
});
export type MessageInput = z.infer<typeof messageInputSchema>;

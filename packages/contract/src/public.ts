import { z } from 'zod';
import { emailSchema, passwordSchema } from '@revloop/domain/auth';
import { PACKAGE_MODULES, jobIntakeSchema } from '@revloop/domain/jobs';
import { nameSchema } from '@revloop/domain/text';
import { vehicleInputSchema } from '@revloop/domain/vehicles';

/** A public page's address: lowercase letters, digits and single hyphens between them, unique across shops. */
export const shopSlugSchema = z
  .string()
  .trim()
  .min(3, 'Use at least 3 characters for the page address.')
  .max(40, 'Use at most 40 characters for the page address.')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lowercase letters, digits and hyphens (not at the start or end), e.g. kestrel-calibration.');

export const shopDescriptionSchema = z.string().trim().max(500, 'Keep the description under 500 characters.');

/** The public-page fields of `PATCH /api/shop`; `slug: null` clears the address (and so turns the page off). */
export const shopFrontDoorPatchSchema = z.object({
  slug: shopSlugSchema.nullable().optional(),
  description: shopDescriptionSchema.optional(),
  publicPage: z.boolean().optional(),
});
export type ShopFrontDoorPatch = z.infer<typeof shopFrontDoorPatchSchema>;

/** What `GET /api/shop` adds about the public page. */
export const shopFrontDoorSchema = z.object({ slug: z.string().nullable(), description: z.string(), publicPage: z.boolean() });
export type ShopFrontDoor = z.infer<typeof shopFrontDoorSchema>;

/** A package as the public sees it: the retail price only, never the dealer price. */
export const publicPackageSchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  modules: z.array(z.enum(PACKAGE_MODULES)),
  retailPriceMinor: z.number().int(),
  roundsIncluded: z.number().int(),
});
export type PublicPackage = z.infer<typeof publicPackageSchema>;

/** `GET /api/public/shops/:slug`: the shop's name, description and active packages; no members, no dealers. */
export const publicShopSchema = z.strictObject({
  slug: z.string(),
  name: z.string(),
  description: z.string(),
  currency: z.string(),
  packages: z.array(publicPackageSchema.strict()),
});
export type PublicShop = z.infer<typeof publicShopSchema>;

/**
 * `POST /api/public/shops/:slug/start`: the customer's account and the job's intake, sent together. The vehicle keeps
 * the intake's `{kind: 'new', vehicle}` shape (a new customer has none on file), so the intake's vehicle fields serve both forms.
 */
export const publicStartSchema = jobIntakeSchema.omit({ customer: true, vehicle: true }).extend({
  name: nameSchema(1, 80, 'Enter your name.'),
  email: emailSchema,
  password: passwordSchema,
  vehicle: z.object({ kind: z.literal('new'), vehicle: vehicleInputSchema }),
});
export type PublicStartInput = z.infer<typeof publicStartSchema>;
export type PublicStartFormValues = z.input<typeof publicStartSchema>;

/** The intake kept with a sign-up until its link is opened. */
export const publicIntakeSchema = publicStartSchema.omit({ name: true, email: true, password: true });
export type PublicIntake = z.infer<typeof publicIntakeSchema>;

export const publicStartResultSchema = z.object({ sent: z.literal(true), email: z.string() });
export type PublicStartResult = z.infer<typeof publicStartResultSchema>;

/** `POST /api/public/shops/:slug/verify`: the token from the e-mailed link. */
export const publicVerifySchema = z.object({ token: z.string().min(20, 'This link is incomplete.').max(200) });
export const publicVerifyResultSchema = z.object({ jobId: z.string() });
export type PublicVerifyResult = z.infer<typeof publicVerifyResultSchema>;

/** The first-run checklist items, in the order a new shop does them. */
export const SHOP_SETUP_ITEMS = ['package', 'log_requests', 'tuner', 'plan', 'public_page'] as const;
export type ShopSetupItem = (typeof SHOP_SETUP_ITEMS)[number];

/** `GET /api/shop/setup`: each item ticks itself from the shop's data. */
export const shopSetupSchema = z.object({
  items: z.array(z.object({ id: z.enum(SHOP_SETUP_ITEMS), done: z.boolean() })),
  done: z.boolean(),
  slug: z.string().nullable(),
});
export type ShopSetup = z.infer<typeof shopSetupSchema>;

import { shopSettingsSchema } from '@revloop/domain/shops';
import { z } from 'zod';
import { itemOf, listOf, timestamp } from './envelope';
import { shopPaymentLockSchema } from './billing';
import { shopRevisionReviewSchema } from './files';
import { shopFrontDoorSchema } from './public';

export const SHOP_STATUSES = ['active', 'suspended'] as const;

/** `GET /api/shop`: the signed-in member's own shop, its settings and its public page. */
export const shopSchema = shopFrontDoorSchema.extend({
  id: z.string(),
  name: z.string(),
  currency: z.string(),
  status: z.enum(SHOP_STATUSES),
  readOnly: z.boolean(),
  settings: shopSettingsSchema,
}).extend(shopRevisionReviewSchema.shape).extend(shopPaymentLockSchema.shape);
export type Shop = z.infer<typeof shopSchema>;
export const shopResponseSchema = itemOf(shopSchema);

/** A shop as the platform admin creates, suspends and reactivates it. */
export const platformShopSchema = z.object({
  id: z.string(),
  name: z.string(),
  status: z.enum(SHOP_STATUSES),
  currency: z.string(),
  createdAt: timestamp,
  suspendedAt: timestamp.nullable(),
});
export type PlatformShop = z.infer<typeof platformShopSchema>;

/** `GET /api/admin/shops`: every shop with its owner and how many members it has. */
export const platformShopListItemSchema = platformShopSchema.extend({
  owner: z.object({ name: z.string().nullable(), email: z.string() }).nullable(),
  memberCount: z.number(),
});
export type PlatformShopListItem = z.infer<typeof platformShopListItemSchema>;
export const platformShopsResponseSchema = listOf(platformShopListItemSchema);

import { z } from 'zod';
import { logRequestSchema } from '@revloop/domain/datalog';
import { shopSettingsSchema, type ShopSettings } from '@revloop/domain/shops';
import type { Shop } from '@revloop/contract';

const familyKey = (family: string) => family.toLowerCase().replace(/[^a-z0-9]/g, '');

/** Shop settings as a form: the per-family log request defaults become an editable list, checked for repeats. */
export const shopSettingsFormSchema = z
  .object({
    name: z.string().trim().min(2, 'Use at least 2 characters.').max(80),
    uploadLimitMiB: shopSettingsSchema.shape.uploadLimitMiB,
    timeZone: shopSettingsSchema.shape.timeZone,
    holdUntilPaid: z.boolean(),
    analysis: shopSettingsSchema.shape.analysis,
    defaults: z.array(logRequestSchema.extend({ family: z.string().trim().min(1, 'Name the engine family.').max(80) })),
  })
  .superRefine((values, ctx) => {
    const seen = new Set<string>();
    values.defaults.forEach((entry, index) => {
      const key = familyKey(entry.family);
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['defaults', index, 'family'], message: `"${entry.family}" is listed twice.` });
      seen.add(key);
    });
  })
  .transform(({ name, uploadLimitMiB, timeZone, holdUntilPaid, analysis, defaults }) => ({
    name,
    settings: {
      uploadLimitMiB,
      timeZone,
      holdUntilPaid,
      // An empty field means "use Revloop's default", so only the shop's own values are kept.
      analysis: Object.fromEntries(Object.entries(analysis).filter(([, value]) => value !== undefined)),
      logRequestDefaults: Object.fromEntries(defaults.map(({ family, ...request }) => [family, request])),
    } satisfies Partial<ShopSettings>,
  }));

export type ShopSettingsFormValues = z.input<typeof shopSettingsFormSchema>;
export type ShopSettingsFormOutput = z.output<typeof shopSettingsFormSchema>;

export function shopSettingsFormDefaults(shop: Shop): ShopSettingsFormValues {
  return {
    name: shop.name,
    uploadLimitMiB: shop.settings.uploadLimitMiB,
    timeZone: shop.settings.timeZone,
    holdUntilPaid: shop.settings.holdUntilPaid,
    analysis: shop.settings.analysis ?? {},
    defaults: Object.entries(shop.settings.logRequestDefaults).map(([family, request]) => ({ family, ...request })),
  };
}

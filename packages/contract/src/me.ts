import { SHOP_ROLES, type Actor } from '@revloop/domain/auth';
import { z } from 'zod';

export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** `GET /api/me`: who is signed in, in which shop and role, and the actor the web builds its ability from. */
export const meSchema = z.object({
  user: z.object({ id: z.string(), email: z.string(), name: z.string(), unitSystem: z.enum(UNIT_SYSTEMS) }),
  role: z.enum([...SHOP_ROLES, 'platform_admin']).nullable(),
  platformAdmin: z.boolean(),
  shop: z
    .object({
      id: z.string(),
      name: z.string(),
      status: z.enum(['active', 'suspended']),
      readOnly: z.boolean(),
      readOnlyReason: z.string().nullable(),
      currency: z.string(),
    })
    .nullable(),
  dealer: z.object({ id: z.string(), name: z.string() }).nullable(),
  // The ability is built from this on both sides; its shape is the domain's.
  actor: z.custom<Actor>((v) => typeof v === 'object' && v !== null),
});
export type Me = z.infer<typeof meSchema>;
/** The session probe answers 200 with null when signed out. */
export const meSessionResponseSchema = z.object({ data: meSchema.nullable() });

import type { Actor } from './roles';

/** The name the timeline and the audit log show for what Revloop did by itself. */
export const SYSTEM_ACTOR_NAME = 'Revloop';

/**
 * The actor of automatic job moves (a stock read arrived, a revision set is complete, a log came in, a payment
 * landed): no user and no shop role, only the `transition` rules its own block in ability.ts gives it. Events it
 * causes are permitted already (an upload, a payment), so a read-only shop does not block what follows from them.
 */
export const systemActorFor = (shopId: string): Actor => ({
  userId: 'system',
  platformAdmin: false,
  shopId,
  role: null,
  dealerId: null,
  shopReadOnly: false,
  system: true,
});

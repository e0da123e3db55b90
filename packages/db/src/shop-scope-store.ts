import { AsyncLocalStorage } from 'node:async_hooks';

// The shop whose work the current async context does (row-security.ts sets it; client.ts reads it when it hands out a
// PostgreSQL connection). Kept apart from both so neither imports the other. `shopId: null` marks work explicitly
// done for no one shop (sign-in, platform admin, a user's memberships across shops).
export const shopScopes = new AsyncLocalStorage<{ shopId: string | null }>();

/** The shop the current async context works for, or null when it is unscoped. */
export function shopScope(): string | null {
  return shopScopes.getStore()?.shopId ?? null;
}

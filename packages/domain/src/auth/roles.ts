/** Roles a member holds in one shop. Platform admins hold no shop role; see `Actor.platformAdmin`. */
export const SHOP_ROLES = ['owner', 'tuner', 'dealer', 'customer'] as const;
export type ShopRole = (typeof SHOP_ROLES)[number];
/** The roles that work in the shop (Team); customers are the shop's clients, listed under Customers. */
export const STAFF_ROLES = ['owner', 'tuner', 'dealer'] as const satisfies readonly ShopRole[];

export const ROLE_LABELS: Record<ShopRole | 'platform_admin', string> = {
  platform_admin: 'Platform admin',
  owner: 'Owner',
  tuner: 'Tuner',
  dealer: 'Dealer',
  customer: 'Customer',
};

/** Who is acting: built from the session on the server and from `/api/me` in the browser. */
export interface Actor {
  userId: string;
  platformAdmin: boolean;
  shopId: string | null;
  role: ShopRole | null;
  /** Set for dealer users: the dealer account they act for. */
  dealerId: string | null;
  /** A suspended or lapsed shop is read-only for everyone in it. */
  shopReadOnly: boolean;
  /** Set only on the system actor (system-actor.ts), which makes the automatic job moves. */
  system?: true;
}

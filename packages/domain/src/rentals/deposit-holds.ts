/**
 * How long a card hold lasts before the provider releases it ([3P] the provider's "Place a hold on a payment method":
 * 7 days for a customer-initiated online authorisation; merchant-initiated on Visa 4 days 18 hours). Our holds are
 * placed off-session when the kit ships, so the shorter window applies (docs/decisions/012-kit-deposit-holds.md).
 */
export const CUSTOMER_HOLD_MS = 7 * 86_400_000;
export const MERCHANT_HOLD_MS = (4 * 24 + 18) * 3_600_000;

/** Re-place a hold this long before it lapses, so the sweep (hourly) always finds it in time. */
export const HOLD_RENEW_MARGIN_MS = 24 * 3_600_000;

/** True when a hold that lapses at `expiresAt` should be re-placed now. */
export const holdNeedsRenewal = (expiresAt: Date, now: Date): boolean =>
  expiresAt.getTime() - now.getTime() <= HOLD_RENEW_MARGIN_MS;

export interface Settlement {
  /** Taken from the hold: late fee plus the owner's capture, never more than is held. */
  captureMinor: number;
  /** Late fee and capture beyond the hold, charged off-session to the saved card. */
  chargeMinor: number;
  lateFeeMinor: number;
  damageMinor: number;
}

/**
 * Splits what the customer owes on return between the hold and an off-session charge: the hold pays first; what it
 * cannot cover is charged to the saved card. A capture of 0 means the whole hold is released.
 */
export function settleDeposit(heldMinor: number, lateFeeMinor: number, damageMinor: number): Settlement {
  const owed = lateFeeMinor + damageMinor;
  const captureMinor = Math.min(heldMinor, owed);
  return { captureMinor, chargeMinor: owed - captureMinor, lateFeeMinor, damageMinor };
}

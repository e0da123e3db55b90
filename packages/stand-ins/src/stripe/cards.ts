import { StripeFakeError } from './errors';
import type { Decline, FakeCard, FakePaymentIntent } from './objects';

export type { Decline } from './objects';
import type { FakeState } from './state';

export interface TestCard {
  number: string;
  card: FakeCard;
  decline: Decline | null;
}

export const GENERIC_DECLINE: Decline = { code: 'card_declined', declineCode: 'generic_decline', message: 'Your card was declined.' };

/** Stripe's published test numbers that this stand-in knows; anything else reads as a mistyped number. */
const TEST_CARDS: Record<string, { brand: string; decline: Decline | null }> = {
  '4242424242424242': { brand: 'visa', decline: null },
  '5555555555554444': { brand: 'mastercard', decline: null },
  '4000000000000002': { brand: 'visa', decline: GENERIC_DECLINE },
  '4000000000009995': {
    brand: 'visa',
    decline: { code: 'card_declined', declineCode: 'insufficient_funds', message: 'Your card has insufficient funds.' },
  },
};

/** Stripe's test PaymentMethod ids that stand for the test numbers above, for server-side confirmation. */
const TEST_PAYMENT_METHODS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_mastercard: '5555555555554444',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
};

export function testPaymentMethodCard(token: string): TestCard | null {
  const number = TEST_PAYMENT_METHODS[token];
  return number ? readTestCard(number) : null;
}

export function readTestCard(input: string): TestCard | null {
  const number = input.replace(/[\s-]/g, '');
  const known = TEST_CARDS[number];
  if (!known) return null;
  return {
    number,
    card: { brand: known.brand, country: 'US', exp_month: 12, exp_year: new Date().getUTCFullYear() + 3, funding: 'credit', last4: number.slice(-4) },
    decline: known.decline,
  };
}

/** A decline queued by the control API for this customer or subscription, used up by the next attempt. */
export function consumeFailure(state: FakeState, ids: (string | null | undefined)[]): Decline | null {
  for (const id of ids) {
    if (id && state.failNext.delete(id)) return GENERIC_DECLINE;
  }
  return null;
}

export function cardError(decline: Decline, intent?: FakePaymentIntent): StripeFakeError {
  return new StripeFakeError(402, {
    type: 'card_error',
    code: decline.code,
    decline_code: decline.declineCode,
    message: decline.message,
    ...(intent ? { charge: intent.latest_charge ?? undefined, payment_intent: { id: intent.id, status: intent.status } } : {}),
  });
}


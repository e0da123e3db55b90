import { Router } from 'express';
import { testPaymentMethodCard, type TestCard } from './cards';
import { invalidRequest, noSuch } from './errors';
import { filtered, id, matches, params, type ApiContext } from './http';
import type { Decline, FakePaymentMethod } from './objects';
import { newId, paginate, type FakeState } from './state';

/** A card PaymentMethod as the hosted page or a test token makes it; a declining test card keeps declining. */
export function createPaymentMethod(state: FakeState, test: TestCard, email: string | null = null): FakePaymentMethod {
  const paymentMethod: FakePaymentMethod = {
    id: newId('pm_'),
    object: 'payment_method',
    billing_details: { address: null, email, name: null, phone: null },
    card: structuredClone(test.card),
    created: state.now(),
    customer: null,
    livemode: false,
    metadata: {},
    type: 'card',
  };
  state.paymentMethods.set(paymentMethod.id, paymentMethod);
  if (test.decline) state.paymentMethodDeclines.set(paymentMethod.id, test.decline);
  return paymentMethod;
}

/** Attaches the card to the customer and makes it the default that invoices charge. */
export function saveCardOnFile(state: FakeState, customerId: string, paymentMethod: FakePaymentMethod): string {
  paymentMethod.customer = customerId;
  state.cardsOnFile.set(customerId, { paymentMethod: paymentMethod.id, card: paymentMethod.card });
  const customer = state.customers.get(customerId);
  if (customer) customer.invoice_settings.default_payment_method = paymentMethod.id;
  return paymentMethod.id;
}

/**
 * The PaymentMethod a PaymentIntent names: a stored one, or one of Stripe's test tokens (`pm_card_visa`),
 * which makes a fresh PaymentMethod each time, as the real API does.
 */
export function resolvePaymentMethod(state: FakeState, ref: string, customer: string | null): { paymentMethod: FakePaymentMethod; decline: Decline | null } {
  const test = testPaymentMethodCard(ref);
  const paymentMethod = test ? createPaymentMethod(state, test) : state.get(state.paymentMethods, 'PaymentMethod', ref, 'payment_method');
  if (paymentMethod.customer && paymentMethod.customer !== customer) {
    throw invalidRequest(
      customer
        ? `The provided PaymentMethod ${paymentMethod.id} is attached to a different Customer.`
        : `The provided PaymentMethod was previously attached to a Customer. To use it, provide that Customer's id as \`customer\`.`,
      'payment_method',
    );
  }
  return { paymentMethod, decline: state.paymentMethodDeclines.get(paymentMethod.id) ?? null };
}

export function paymentMethodsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.get('/payment_methods/:id', (req, res) => {
    res.json(send(req, state.get(state.paymentMethods, 'PaymentMethod', id(req))));
  });
  router.get('/payment_methods', (req, res) => {
    const query = params(req);
    const list = filtered(state.paymentMethods.values(), (pm) => pm.customer !== null && matches(query, 'customer', pm.customer) && matches(query, 'type', pm.type));
    res.json(send(req, paginate(list, query, '/v1/payment_methods')));
  });
  router.get('/customers/:id/payment_methods', (req, res) => {
    const customer = id(req);
    if (!state.customers.has(customer)) throw noSuch('customer', customer);
    const query = params(req);
    const list = filtered(state.paymentMethods.values(), (pm) => pm.customer === customer && matches(query, 'type', pm.type));
    res.json(send(req, paginate(list, query, `/v1/customers/${customer}/payment_methods`)));
  });
  return router;
}

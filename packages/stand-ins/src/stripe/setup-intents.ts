import { Router } from 'express';
import { filtered, id, matches, params, type ApiContext } from './http';
import type { FakeSetupIntent, Metadata } from './objects';
import { newId, paginate, type FakeState } from './state';

/** A SetupIntent that has already succeeded: the hosted page collected the card, so nothing is left to confirm. */
export function createSucceededSetupIntent(state: FakeState, customer: string | null, paymentMethod: string, metadata: Metadata): FakeSetupIntent {
  const setupIntent: FakeSetupIntent = {
    id: newId('seti_'),
    object: 'setup_intent',
    created: state.now(),
    customer,
    livemode: false,
    metadata,
    payment_method: paymentMethod,
    payment_method_types: ['card'],
    status: 'succeeded',
    usage: 'off_session',
  };
  state.setupIntents.set(setupIntent.id, setupIntent);
  state.emit('setup_intent.succeeded', setupIntent);
  return setupIntent;
}

export function setupIntentsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.get('/setup_intents/:id', (req, res) => {
    res.json(send(req, state.get(state.setupIntents, 'setup_intent', id(req))));
  });
  router.get('/setup_intents', (req, res) => {
    const query = params(req);
    const list = filtered(state.setupIntents.values(), (s) => matches(query, 'customer', s.customer) && matches(query, 'payment_method', s.payment_method));
    res.json(send(req, paginate(list, query, '/v1/setup_intents')));
  });
  return router;
}

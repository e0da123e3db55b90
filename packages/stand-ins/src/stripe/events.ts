import { Router } from 'express';
import { filtered, id, matches, params, type ApiContext } from './http';
import { stringList } from './params';
import { paginate } from './state';

export function eventsRouter({ state, send }: ApiContext): Router {
  const router = Router();
  router.get('/events/:id', (req, res) => {
    res.json(send(req, state.get(state.events, 'event', id(req))));
  });
  router.get('/events', (req, res) => {
    const query = params(req);
    const types = stringList(query.types);
    const list = filtered(state.events.values(), (e) => matches(query, 'type', e.type) && (types.length === 0 || types.includes(e.type)));
    res.json(send(req, paginate(list, query, '/v1/events')));
  });

  return router;
}


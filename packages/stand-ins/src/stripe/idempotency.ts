import type { RequestHandler } from 'express';
import { StripeFakeError } from './errors';
import type { FakeState } from './state';

const KEY_LIFETIME_SECONDS = 24 * 60 * 60;

/**
 * Replays the saved answer for a repeated `Idempotency-Key`. Like Stripe, it saves only requests that
 * ran (successes and card declines), not ones rejected as invalid, and keys expire after 24 h of fake time.
 */
export function idempotency(state: FakeState): RequestHandler {
  const saved = state.idempotencyKeys;
  return (req, res, next) => {
    const key = req.get('idempotency-key');
    if (req.method !== 'POST' || !key) {
      next();
      return;
    }
    const now = state.now();
    for (const [scope, entry] of saved) {
      if (entry.created + KEY_LIFETIME_SECONDS <= now) saved.delete(scope);
    }
    const scope = `${req.get('authorization') ?? ''} ${key}`;
    const fingerprint = JSON.stringify([req.method, req.originalUrl.split('?')[0], req.body]);
    res.set('Idempotency-Key', key);
    const hit = saved.get(scope);
    if (hit) {
      if (hit.fingerprint !== fingerprint) {
        throw new StripeFakeError(400, {
          type: 'idempotency_error',
          message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
        });
      }
      res.set('Idempotent-Replayed', 'true');
      res.status(hit.status).json(hit.body);
      return;
    }
    const json = res.json.bind(res);
    res.json = (body: unknown) => {
      if (res.statusCode < 300 || res.statusCode === 402) saved.set(scope, { fingerprint, status: res.statusCode, body, created: now });
      return json(body);
    };
    next();
  };
}

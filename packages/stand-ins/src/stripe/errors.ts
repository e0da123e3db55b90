import type { ErrorRequestHandler } from 'express';

export type StripeErrorType = 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';

export interface StripeErrorBody {
  type: StripeErrorType;
  message: string;
  code?: string;
  decline_code?: string;
  param?: string;
  charge?: string;
  payment_intent?: { id: string; status: string };
}

/** An error the fake answers in Stripe's own `{ error: { type, code, message, param } }` shape. */
export class StripeFakeError extends Error {
  constructor(
    readonly status: number,
    readonly body: StripeErrorBody,
  ) {
    super(body.message);
  }
}

export function invalidRequest(message: string, param?: string, code?: string): StripeFakeError {
  return new StripeFakeError(400, { type: 'invalid_request_error', message, ...(code ? { code } : {}), ...(param ? { param } : {}) });
}

export function missingParam(param: string): StripeFakeError {
  return invalidRequest(`Missing required param: ${param}.`, param, 'parameter_missing');
}

export function noSuch(noun: string, id: string, param = 'id'): StripeFakeError {
  return new StripeFakeError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${noun}: '${id}'`, param });
}

export const stripeErrorHandler: ErrorRequestHandler = (err: unknown, _req, res, _next) => {
  if (err instanceof StripeFakeError) {
    res.status(err.status).json({ error: err.body });
    return;
  }
  // Body-parser errors carry a status; everything else is the fake's own bug and reads as Stripe's api_error.
  const status = typeof err === 'object' && err !== null && 'status' in err && typeof err.status === 'number' ? err.status : 500;
  const message = err instanceof Error ? err.message : 'Unexpected error';
  res.status(status).json({ error: { type: status < 500 ? 'invalid_request_error' : 'api_error', message } });
};

import type { ErrorRequestHandler } from 'express';
import { isDomainError, type DomainErrorCode } from '@revloop/domain';
import { ZodError } from 'zod';

const STATUS: Record<DomainErrorCode, number> = {
  validation: 400,
  unauthenticated: 401,
  forbidden: 403,
  shop_read_only: 403,
  not_found: 404,
  conflict: 409,
  invalid_transition: 409,
  rental_clash: 409,
  payload_too_large: 413,
  invalid_file: 422,
  invalid_datalog: 422,
  rate_limited: 429,
  insufficient_balance: 402,
  payment_required: 402,
};

export const statusForCode = (code: DomainErrorCode): number => STATUS[code];

/** One place turns every error into `{error:{code,message}}`; unknown errors never leak their text. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (isDomainError(err)) {
    res.status(STATUS[err.code]).json({ error: { code: err.code, message: err.message, details: err.details } });
    return;
  }
  if (err instanceof ZodError) {
    const first = err.issues[0];
    const where = first?.path.length ? `${first.path.join('.')}: ` : '';
    res.status(400).json({
      error: { code: 'validation', message: `${where}${first?.message ?? 'Invalid input.'}`, details: err.issues },
    });
    return;
  }
  // The Stripe SDK's errors (StripeInvalidRequestError, StripeConnectionError, …) carry the provider's own status,
  // which says nothing about our request: the provider refused or failed, so the answer is a 502 in plain words.
  if (typeof err?.type === 'string' && err.type.startsWith('Stripe')) {
    req.log?.warn({ err }, 'payment provider error');
    res.status(502).json({ error: { code: 'payment_provider', message: `The payment provider did not accept the request: ${err.message}` } });
    return;
  }
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
  if (status === 413 || err?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: { code: 'payload_too_large', message: 'The upload is larger than this shop allows.' } });
    return;
  }
  if (status >= 400 && status < 500) {
    const message = err?.type === 'entity.parse.failed' ? 'The request body is not valid JSON.' : 'The request was not understood.';
    res.status(status).json({ error: { code: 'validation', message } });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Please try again.' } });
};

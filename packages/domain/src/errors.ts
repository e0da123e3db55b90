/** Every rule broken in domain code is a DomainError; apps/api maps each code to an HTTP status. */
export type DomainErrorCode =
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'invalid_transition'
  | 'rental_clash'
  | 'invalid_file'
  | 'invalid_datalog'
  | 'payload_too_large'
  | 'rate_limited'
  | 'shop_read_only'
  | 'insufficient_balance'
  | 'payment_required';

export class DomainError extends Error {
  readonly code: DomainErrorCode;
  readonly details: unknown;

  constructor(code: DomainErrorCode, message: string, details?: unknown) {
    super(message);
    this.name = 'DomainError';
    this.code = code;
    this.details = details;
  }
}

export const isDomainError = (value: unknown): value is DomainError => value instanceof DomainError;

import { isApiError } from './api-client';

/**
 * Field messages from an API validation error. The server sends either zod's flattened
 * `{fieldErrors: {field: [message]}}` or a list of `{path, message}` issues in `details`.
 */
export function fieldErrorsFrom(error: unknown): Record<string, string> {
  if (!isApiError(error) || !error.details || typeof error.details !== 'object') return {};
  const result: Record<string, string> = {};
  const details = error.details as { fieldErrors?: unknown; issues?: unknown };
  if (details.fieldErrors && typeof details.fieldErrors === 'object') {
    for (const [field, messages] of Object.entries(details.fieldErrors as Record<string, unknown>)) {
      if (Array.isArray(messages) && typeof messages[0] === 'string') result[field] = messages[0];
    }
  }
  const issues = Array.isArray(details.issues) ? details.issues : Array.isArray(error.details) ? error.details : [];
  for (const issue of issues as Array<{ path?: unknown; message?: unknown }>) {
    const field = Array.isArray(issue.path) ? issue.path.join('.') : typeof issue.path === 'string' ? issue.path : '';
    if (field && typeof issue.message === 'string' && !result[field]) result[field] = issue.message;
  }
  return result;
}

/** The sentence to show for a failed request. */
export function errorMessage(error: unknown): string {
  if (isApiError(error)) {
    if (error.status === 429) {
      return error.retryAfterSeconds !== null
        ? `Too many attempts, try again in ${error.retryAfterSeconds} seconds.`
        : 'Too many attempts, try again in a little while.';
    }
    return error.message;
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}

/** Puts the server's field messages beside the matching fields; returns true when any matched. */
export function applyFieldErrors(error: unknown, fields: readonly string[], setError: (field: string, message: string) => void): boolean {
  let matched = false;
  for (const [field, message] of Object.entries(fieldErrorsFrom(error))) {
    if (fields.includes(field)) {
      setError(field, message);
      matched = true;
    }
  }
  return matched;
}

/** Summary rows for a form: each field error linked to its control, then the server's message. */
export function summaryItems(
  errors: Record<string, { message?: unknown } | undefined>,
  idPrefix: string,
  serverError?: string | null,
): Array<{ fieldId?: string; message: string }> {
  const items: Array<{ fieldId?: string; message: string }> = [];
  for (const [field, error] of Object.entries(errors)) {
    if (field === 'root' || typeof error?.message !== 'string') continue;
    items.push({ fieldId: `${idPrefix}-${field}`, message: error.message });
  }
  if (serverError) items.push({ message: serverError });
  return items;
}

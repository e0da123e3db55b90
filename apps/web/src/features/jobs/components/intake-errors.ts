/** A field error anywhere in a nested react-hook-form error tree, with the dotted path that names its field. */
export interface FlatFieldError {
  path: string;
  message: string;
}

const isRecord = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null;

/**
 * Walks a react-hook-form `errors` object (nested objects and arrays, each leaf with a `message`) and lists
 * every message once, in form order, so the summary above a long form names each problem.
 */
export function flattenFieldErrors(errors: unknown, prefix = ''): FlatFieldError[] {
  if (!isRecord(errors)) return [];
  const own = typeof errors.message === 'string' && errors.message && prefix ? [{ path: prefix, message: errors.message }] : [];
  const nested = Object.entries(errors).flatMap(([key, value]) => {
    if (key === 'message' || key === 'type' || key === 'ref' || key === 'types' || key === 'root') return [];
    return flattenFieldErrors(value, prefix ? `${prefix}.${key}` : key);
  });
  return [...own, ...nested];
}

/** The DOM id a field at `path` gets in a form whose ids start with `prefix`. */
export const fieldId = (prefix: string, path: string) => `${prefix}-${path.replaceAll('.', '-')}`;

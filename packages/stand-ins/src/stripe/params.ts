import { invalidRequest, missingParam } from './errors';
import type { Metadata } from './objects';

/** A form-decoded Stripe request body or query: nested objects and arrays of strings. */
export type Params = Record<string, unknown>;

export function asParams(value: unknown, name: string): Params {
  if (value === undefined || value === '') return {};
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw invalidRequest(`Invalid object`, name);
  return value as Params;
}

export function allowOnly(params: Params, allowed: readonly string[]): void {
  for (const key of Object.keys(params)) {
    if (key !== 'expand' && !allowed.includes(key)) throw invalidRequest(`Received unknown parameter: ${key}`, key, 'parameter_unknown');
  }
}

export function optString(params: Params, name: string): string | undefined {
  const value = params[name];
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw invalidRequest(`Invalid string: ${name}`, name);
  return value;
}

export function reqString(params: Params, name: string): string {
  const value = optString(params, name);
  if (value === undefined || value === '') throw missingParam(name);
  return value;
}

/** Empty string means "unset" in Stripe's form encoding. */
export function optNullableString(params: Params, name: string): string | null | undefined {
  const value = optString(params, name);
  return value === '' ? null : value;
}

export function optInt(params: Params, name: string, min = 0): number | undefined {
  const value = optString(params, name);
  if (value === undefined) return undefined;
  if (!/^-?\d+$/.test(value)) throw invalidRequest(`Invalid integer: ${value}`, name);
  const n = Number(value);
  if (n < min) throw invalidRequest(`This value must be greater than or equal to ${min}.`, name);
  return n;
}

export function optBool(params: Params, name: string): boolean | undefined {
  const value = optString(params, name);
  if (value === undefined) return undefined;
  if (value !== 'true' && value !== 'false') throw invalidRequest(`Invalid boolean: ${value}`, name);
  return value === 'true';
}

export function optEnum<T extends string>(params: Params, name: string, values: readonly T[]): T | undefined {
  const value = optString(params, name);
  if (value === undefined) return undefined;
  if (!(values as readonly string[]).includes(value)) {
    throw invalidRequest(`Invalid ${name}: must be one of ${values.join(', ')}`, name);
  }
  return value as T;
}

/** qs turns `a[0]=…` into an array, but past 20 indices into an object keyed "0", "1", … */
export function optArray(params: Params, name: string): Params[] | undefined {
  const value = params[name];
  if (value === undefined || value === '') return undefined;
  const items = Array.isArray(value)
    ? value
    : typeof value === 'object' && value !== null
      ? Object.entries(value)
          .sort(([a], [b]) => Number(a) - Number(b))
          .map(([, v]) => v)
      : undefined;
  if (!items) throw invalidRequest(`Invalid array`, name);
  return items.map((item, i) => asParams(item, `${name}[${i}]`));
}

export function stringList(value: unknown): string[] {
  if (value === undefined) return [];
  if (typeof value === 'string') return [value];
  if (Array.isArray(value)) return value.filter((v): v is string => typeof v === 'string');
  if (typeof value === 'object' && value !== null) return Object.values(value).filter((v): v is string => typeof v === 'string');
  return [];
}

/** Applies Stripe's metadata semantics: `metadata=` clears all, `metadata[k]=` removes one key. */
export function applyMetadata(current: Metadata, params: Params, name = 'metadata'): Metadata {
  const raw = params[name];
  if (raw === undefined) return current;
  if (raw === '') return {};
  const updates = asParams(raw, name);
  const next = { ...current };
  for (const [key, value] of Object.entries(updates)) {
    if (typeof value !== 'string') throw invalidRequest(`Invalid metadata value for ${key}`, `${name}[${key}]`);
    if (key.length > 40) throw invalidRequest('Metadata keys can have a maximum length of 40 characters.', `${name}[${key}]`);
    if (value.length > 500) throw invalidRequest('Metadata values can have a maximum length of 500 characters.', `${name}[${key}]`);
    if (value === '') delete next[key];
    else next[key] = value;
  }
  if (Object.keys(next).length > 50) throw invalidRequest('Metadata can have a maximum of 50 keys.', name);
  return next;
}

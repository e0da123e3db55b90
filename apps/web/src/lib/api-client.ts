/** The one way the web app talks to the server: same-origin JSON over /api, errors as ApiError. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;
  /** Seconds from a Retry-After header (429), when the server sent one. */
  readonly retryAfterSeconds: number | null;

  constructor(status: number, code: string, message: string, details?: unknown, retryAfterSeconds: number | null = null) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
    this.retryAfterSeconds = retryAfterSeconds;
  }
}

export const isApiError = (value: unknown): value is ApiError => value instanceof ApiError;

/** Retry-After is either delta-seconds or an HTTP date (RFC 9110 §10.2.3). */
export function parseRetryAfter(header: string | null, now: number = Date.now()): number | null {
  if (!header) return null;
  const trimmed = header.trim();
  if (/^\d+$/.test(trimmed)) return Number(trimmed);
  const at = Date.parse(trimmed);
  if (Number.isNaN(at)) return null;
  return Math.max(0, Math.ceil((at - now) / 1000));
}

interface ErrorBody {
  error?: { code?: unknown; message?: unknown; details?: unknown };
}

async function toApiError(response: Response): Promise<ApiError> {
  const retryAfter = parseRetryAfter(response.headers.get('Retry-After'));
  // A proxy or crash page may answer with HTML; the status still tells what happened.
  const body = (await response.json().catch(() => null)) as ErrorBody | null;
  const code = typeof body?.error?.code === 'string' ? body.error.code : `http_${response.status}`;
  const message =
    typeof body?.error?.message === 'string' && body.error.message
      ? body.error.message
      : `The server answered ${response.status} ${response.statusText}`.trim() + '.';
  return new ApiError(response.status, code, message, body?.error?.details, retryAfter);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export async function apiRequest<T>(method: Method, path: string, body?: unknown): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.');
  }
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204 || response.status === 202) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get: <T>(path: string) => apiRequest<T>('GET', path),
  post: <T>(path: string, body?: unknown) => apiRequest<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => apiRequest<T>('PATCH', path, body),
  delete: <T = void>(path: string) => apiRequest<T>('DELETE', path),
};

/** Shapes of the API's envelopes. */
export interface ListResponse<T> {
  data: T[];
  meta?: { total: number };
}
export interface ItemResponse<T> {
  data: T;
}

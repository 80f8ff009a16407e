import type { ApiErrorBody, ErrorCode } from '@midgray/shared';

/** An API failure with the server's code, message and details (field errors, missing items). */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode | 'network',
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

let csrfToken: string | null = null;
let csrfFetch: Promise<string> | null = null;

/**
 * Returns the session's CSRF token, fetching it once per page load (and again after a 403).
 * Callers that ask at the same moment (several uploads starting at once) share one fetch: two
 * fetches would make two tokens, and the session would keep only the one saved last.
 */
export function getCsrfToken(refresh = false): Promise<string> {
  if (csrfToken && !refresh) return Promise.resolve(csrfToken);
  if (csrfFetch && !refresh) return csrfFetch;
  const pending = fetch('/api/auth/csrf', { credentials: 'same-origin' })
    .then((res) => res.json() as Promise<{ token: string }>)
    .then((body) => (csrfToken = body.token))
    .finally(() => {
      if (csrfFetch === pending) csrfFetch = null;
    });
  csrfFetch = pending;
  return pending;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

/** Calls the API and returns the parsed JSON (undefined for 204); throws ApiError on failure. */
export async function api<T>(method: Method, path: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers['X-CSRF-Token'] = await getCsrfToken();
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await fetch(path, { method, headers, credentials: 'same-origin', body: body === undefined ? undefined : JSON.stringify(body) });
  } catch {
    throw new ApiError(0, 'network', 'Cannot reach Midgray: check your connection and try again');
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  const json = text ? JSON.parse(text) : undefined;
  if (!res.ok) {
    const err = (json as ApiErrorBody | undefined)?.error;
    if (res.status === 403 && err?.code === 'csrf_failed' && !retried) {
      await getCsrfToken(true);
      return api<T>(method, path, body, true);
    }
    throw new ApiError(res.status, err?.code ?? 'internal', err?.message ?? `Request failed (${res.status})`, err?.details);
  }
  return json as T;
}

// The one way the app talks to the API: same-origin fetch, CSRF header on changes,
// errors as ApiError with the server's message, responses parsed with shared/ schemas.
import type { z } from 'zod';
import { apiErrorSchema } from '../../shared/api-error';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
    readonly body: unknown = null,
  ) {
    super(message);
  }
}

let csrfToken: string | null = null;

async function fetchCsrfToken(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return body.token;
}

/** Forget the token, e.g. after sign-out, when the server starts a fresh session. */
export const resetCsrfToken = () => {
  csrfToken = null;
};

async function toApiError(res: Response): Promise<ApiError> {
  const body = await res.json().catch(() => null);
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) return new ApiError(res.status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.fields, body);
  return new ApiError(res.status, 'http_' + res.status, res.status >= 500 ? 'The server had a problem. Try again.' : `Request failed (${res.status}).`, {}, body);
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  form?: FormData;
}

async function send(path: string, { method = 'GET', body, form }: RequestOptions, retried = false): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrfToken());
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await fetch(path, { method, headers, credentials: 'same-origin', body: form ?? (body === undefined ? undefined : JSON.stringify(body)) });
  } catch {
    throw new ApiError(0, 'offline', 'No connection to Causeway. Check the Wi-Fi and try again.');
  }
  if (res.status === 403 && method !== 'GET' && !retried) {
    const err = await toApiError(res.clone());
    if (err.code === 'csrf') {
      await fetchCsrfToken();
      return send(path, { method, body, form }, true);
    }
  }
  return res;
}

export async function api<T = unknown>(path: string, options: RequestOptions = {}, schema?: z.ZodType<T>): Promise<T> {
  const res = await send(path, options);
  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as T;
  const json: unknown = await res.json();
  return schema ? schema.parse(json) : (json as T);
}

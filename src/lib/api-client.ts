import { apiErrorSchema } from '@shared/schemas/api-error';

/** An API failure with the server's code, message and per-field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

let csrfToken: string | null = null;

export function setCsrfToken(token: string | null) {
  csrfToken = token;
}

async function ensureCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  const response = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const body = (await response.json()) as { csrfToken: string };
  csrfToken = body.csrfToken;
  return csrfToken;
}

async function toApiError(response: Response): Promise<ApiError> {
  const parsed = apiErrorSchema.safeParse(await response.json().catch(() => null));
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(response.status, code, message, fields);
  }
  return new ApiError(response.status, 'unknown', `The server answered ${response.status}. Try again in a moment.`);
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** Every server call goes through here: JSON in and out, CSRF header, one error type. */
export async function api<T>(method: Method, path: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (body !== undefined) headers['content-type'] = 'application/json';
  if (method !== 'GET') headers['x-csrf-token'] = await ensureCsrfToken();
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'offline', 'Could not reach Sheetsmith. Check your connection; nothing was lost.');
  }
  if (response.ok) {
    if (response.status === 204) return undefined as T;
    const data = (await response.json()) as T;
    const token = (data as { csrfToken?: unknown } | null)?.csrfToken;
    if (typeof token === 'string') csrfToken = token;
    return data;
  }
  const error = await toApiError(response);
  // The session changed under us (expired or signed in elsewhere): fetch a fresh token once.
  if (error.code === 'csrf_invalid' && !retried) {
    csrfToken = null;
    return api<T>(method, path, body, true);
  }
  throw error;
}

/** A multipart upload (a form with a file) through the same CSRF and error handling. */
export async function apiUpload<T>(path: string, form: FormData): Promise<T> {
  const response = await fetch(`/api${path}`, {
    method: 'POST',
    headers: { accept: 'application/json', 'x-csrf-token': await ensureCsrfToken() },
    credentials: 'same-origin',
    body: form,
  });
  if (!response.ok) throw await toApiError(response);
  return (await response.json()) as T;
}

/** Browsers carry at most 64 KiB of keepalive bodies per page (Fetch standard, "keepalive"). */
export const KEEPALIVE_MAX_BYTES = 60 * 1024;

/**
 * A write that outlives the page (sent on pagehide): keepalive fetch, same CSRF header. Returns
 * false when it could not be sent (too large, or no token yet), so the caller knows to ask first.
 */
export function sendOnLeave(method: 'PUT' | 'POST', path: string, body: unknown): boolean {
  const json = JSON.stringify(body);
  if (!csrfToken || new Blob([json]).size > KEEPALIVE_MAX_BYTES) return false;
  void fetch(`/api${path}`, {
    method,
    headers: { accept: 'application/json', 'content-type': 'application/json', 'x-csrf-token': csrfToken },
    credentials: 'same-origin',
    body: json,
    keepalive: true,
  }).catch(() => undefined);
  return true;
}

import type { z } from 'zod';
import { checkContract } from '../../shared/contract/check';
import { errorReply } from '../../shared/contract/common';
import { csrfReply } from '../../shared/contract/people';

/** An error reply of the Anglebench API, `{ error: { code, message } }`, as a typed error. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/** The ApiError of a failed reply: its `{ error }` body when it has one, else its status line. */
export function apiErrorOf(status: number, statusText: string, body: unknown): ApiError {
  const parsed = errorReply.safeParse(body);
  return parsed.success
    ? new ApiError(status, parsed.data.error.code, parsed.data.error.message)
    : new ApiError(status, `http_${status}`, `${status} ${statusText}`.trim());
}

export interface ApiRequest extends Omit<RequestInit, 'body'> {
  /** A plain object is sent as JSON; FormData and Blob are sent as they are. */
  body?: unknown;
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

// The session's CSRF token, fetched once and shared by every write. Sign-in and sign-out change
// the session, so they replace or forget it (setCsrfToken / forgetCsrfToken).
let csrfToken: Promise<string> | null = null;

/** The session's CSRF token, from GET /api/auth/csrf on first use. */
export function csrfTokenForWrites(): Promise<string> {
  csrfToken ??= apiReply(csrfReply, '/api/auth/csrf').then(
    (r) => r.token,
    (err: unknown) => {
      csrfToken = null; // try again on the next write
      throw err;
    },
  );
  return csrfToken;
}

/** Keep the token a sign-in reply carried (the session was regenerated). */
export function setCsrfToken(token: string): void {
  csrfToken = Promise.resolve(token);
}

/** Forget the token (after sign-out); the next write fetches a fresh one. */
export function forgetCsrfToken(): void {
  csrfToken = null;
}

/**
 * Fetch `/api…` with the session cookie; resolve to the parsed JSON or throw an ApiError.
 * Writes carry the x-csrf-token header; a stale token is refreshed and the write sent once more.
 */
export async function api<T>(path: string, init: ApiRequest = {}): Promise<T> {
  const method = (init.method ?? 'GET').toUpperCase();
  if (SAFE_METHODS.has(method)) return send<T>(path, init, null);
  try {
    return await send<T>(path, init, await csrfTokenForWrites());
  } catch (err) {
    if (!(err instanceof ApiError && err.status === 403 && err.code === 'csrf')) throw err;
    forgetCsrfToken();
    return send<T>(path, init, await csrfTokenForWrites());
  }
}

/**
 * `api` for a reply the contract describes (shared/contract): typed from `schema` and, in
 * development, checked against it, so a renamed or missing field throws a ContractError naming
 * it instead of showing an empty page. The value is returned as received, not re-parsed.
 */
export async function apiReply<S extends z.ZodType>(schema: S, path: string, init: ApiRequest = {}): Promise<z.output<S>> {
  const value = await api<unknown>(path, init);
  if (import.meta.env.DEV) checkContract(schema, value, `The reply to ${(init.method ?? 'GET').toUpperCase()} ${path}`);
  return value as z.output<S>;
}

async function send<T>(path: string, init: ApiRequest, csrf: string | null): Promise<T> {
  const headers = new Headers(init.headers);
  if (csrf) headers.set('x-csrf-token', csrf);
  let body: BodyInit | undefined;
  if (init.body instanceof FormData || init.body instanceof Blob) body = init.body;
  else if (init.body !== undefined) {
    body = JSON.stringify(init.body);
    headers.set('content-type', 'application/json');
  }
  headers.set('accept', 'application/json');
  let res: Response;
  try {
    res = await fetch(path, { ...init, body, headers, credentials: 'same-origin' });
  } catch (cause) {
    if ((cause as Error).name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server could not be reached. Is it running?');
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  let parsed: unknown = undefined;
  try {
    parsed = text ? JSON.parse(text) : undefined;
  } catch {
    // Not JSON (a proxy page, say): reported below with the status.
  }
  if (!res.ok) throw apiErrorOf(res.status, res.statusText, parsed);
  return parsed as T;
}

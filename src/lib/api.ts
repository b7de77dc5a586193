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

export interface ApiRequest extends Omit<RequestInit, 'body'> {
  /** A plain object is sent as JSON; FormData and Blob are sent as they are. */
  body?: unknown;
}

/** Fetch `/api…` with the session cookie; resolve to the parsed JSON or throw an ApiError. */
export async function api<T>(path: string, init: ApiRequest = {}): Promise<T> {
  const headers = new Headers(init.headers);
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
  if (!res.ok) {
    const err = (parsed as { error?: { code?: string; message?: string } } | undefined)?.error;
    throw new ApiError(res.status, err?.code ?? `http_${res.status}`, err?.message ?? `${res.status} ${res.statusText}`);
  }
  return parsed as T;
}

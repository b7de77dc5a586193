import { ApiError } from '../../../lib/api';

/** GET a binary reply (samples, capture) with the session cookie; errors as ApiError. */
export async function fetchBytes(path: string, signal?: AbortSignal): Promise<ArrayBuffer> {
  let res: Response;
  try {
    res = await fetch(path, { credentials: 'same-origin', signal });
  } catch (cause) {
    if ((cause as Error).name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server could not be reached. Is it running?');
  }
  if (!res.ok) {
    let message = `${res.status} ${res.statusText}`;
    let code = `http_${res.status}`;
    try {
      const body = (await res.json()) as { error?: { code?: string; message?: string } };
      message = body.error?.message ?? message;
      code = body.error?.code ?? code;
    } catch {
      // not JSON: keep the status line
    }
    throw new ApiError(res.status, code, message);
  }
  return res.arrayBuffer();
}

import { ApiError, apiErrorOf } from '../../../lib/api';

/** GET a binary reply (samples, capture) with the session cookie; errors as ApiError. */
export async function fetchBytes(path: string, signal?: AbortSignal): Promise<ArrayBuffer> {
  let res: Response;
  try {
    res = await fetch(path, { credentials: 'same-origin', signal });
  } catch (cause) {
    if ((cause as Error).name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server could not be reached. Is it running?');
  }
  // Not JSON (a proxy page, say): the status line is the error.
  if (!res.ok) throw apiErrorOf(res.status, res.statusText, await res.json().catch(() => undefined));
  return res.arrayBuffer();
}

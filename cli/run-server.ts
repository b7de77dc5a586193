// The runner's side of the server: the core under test (model, limits, link profile) read with
// a personal API token, and the session upload. Errors are one line, for exit status 2.
import { z } from 'zod';
import { isCrc8Name, type Crc8Name } from '../shared/link';
import { parseModelConfig, type ModelConfig } from '../shared/numeric';
import { parseLimits, type Limits } from './run-verdict';

export type Fetch = typeof fetch;

/** Anything the server said no to, or could not be reached for. */
export class ServerError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ServerError';
  }
}

/** The server has no session upload route yet (it answers 404 not_found for the route). */
export class UploadUnavailableError extends ServerError {
  constructor() {
    super('session upload is not available on this server yet');
  }
}

export interface ServerCore {
  id: number;
  slug: string;
  name: string;
  model: ModelConfig;
  limits: Limits;
  baud: number | null;
  crc: Crc8Name | null;
}

const coreRow = z.object({
  id: z.number().int(),
  slug: z.string(),
  name: z.string(),
  mode: z.string().optional(),
  modelConfig: z.unknown(),
  limits: z.unknown(),
  linkProfile: z.object({ baud: z.number().int().optional(), crc: z.string().optional() }).partial().nullish(),
});

async function call(fetchImpl: Fetch, url: string, init: RequestInit, what: string): Promise<Response> {
  try {
    return await fetchImpl(url, { ...init, signal: AbortSignal.timeout(15_000) });
  } catch (e) {
    const cause = (e as { cause?: { code?: string; message?: string } }).cause;
    throw new ServerError(`cannot reach the server for ${what} at ${url}: ${cause?.code ?? cause?.message ?? (e as Error).message}`);
  }
}

/** `{ error: { code, message } }` is every server error's shape; fall back to the status line. */
async function reason(res: Response): Promise<{ code: string; message: string }> {
  const text = await res.text().catch(() => '');
  try {
    const body = JSON.parse(text) as { error?: { code?: string; message?: string } };
    if (body.error?.message) return { code: body.error.code ?? '', message: body.error.message };
  } catch {
    // not JSON
  }
  return { code: '', message: `${res.status} ${res.statusText}`.trim() };
}

/** The core with this slug, from GET /api/cores. */
export async function fetchCore(fetchImpl: Fetch, server: { url: string; token: string }, slug: string): Promise<ServerCore> {
  const url = `${server.url}/api/cores`;
  const res = await call(fetchImpl, url, { headers: { authorization: `Bearer ${server.token}`, accept: 'application/json' } }, 'the core list');
  if (res.status === 401) throw new ServerError(`the server refused the token: ${(await reason(res)).message}`);
  if (!res.ok) throw new ServerError(`the server refused GET /api/cores: ${(await reason(res)).message}`);
  let rows: unknown;
  try {
    rows = ((await res.json()) as { cores?: unknown }).cores;
  } catch {
    throw new ServerError(`GET ${url} did not answer JSON: is --server the Anglebench server?`);
  }
  const list = z.array(coreRow).safeParse(rows);
  if (!list.success) throw new ServerError(`GET ${url} answered an unexpected shape: is --server the Anglebench server?`);
  const row = list.data.find((c) => c.slug === slug);
  if (!row) throw new ServerError(`the server has no core "${slug}" (it has: ${list.data.map((c) => c.slug).join(', ') || 'none'})`);
  if (row.mode !== undefined && row.mode !== 'rotation') throw new ServerError(`core "${slug}" is a ${row.mode} core: this runner runs rotation cores only`);
  let model: ModelConfig;
  try {
    model = parseModelConfig(row.modelConfig);
  } catch (e) {
    throw new ServerError(`core "${slug}" on the server has a model configuration this runner cannot use: ${(e as Error).message}`);
  }
  const crc = row.linkProfile?.crc;
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    model,
    limits: parseLimits(row.limits ?? {}, `core "${slug}" limits`),
    baud: row.linkProfile?.baud ?? null,
    crc: crc !== undefined && isCrc8Name(crc) ? crc : null,
  };
}

/** What the runner uploads: the session as JSON, the packed samples and the capture archive. */
export interface SessionUpload {
  session: Record<string, unknown>;
  /** Answered results in request order: (angle code, cos, sin) as little-endian i32 triples. */
  samples: Uint8Array;
  archive: Uint8Array;
}

/**
 * POST /api/sessions as multipart/form-data (fields `session`, JSON; files `samples`, `archive`).
 * Returns the new session's id and the address people open it at (the server's PUBLIC_URL),
 * when the server names them.
 */
export async function uploadSession(fetchImpl: Fetch, server: { url: string; token: string }, upload: SessionUpload): Promise<{ id: number | null; url: string | null }> {
  const form = new FormData();
  form.set('session', JSON.stringify(upload.session));
  form.set('samples', new Blob([upload.samples.slice()], { type: 'application/octet-stream' }), 'samples.bin');
  form.set('archive', new Blob([upload.archive.slice()], { type: 'application/octet-stream' }), 'capture.abrc');
  const url = `${server.url}/api/sessions`;
  const res = await call(fetchImpl, url, { method: 'POST', headers: { authorization: `Bearer ${server.token}` }, body: form }, 'the upload');
  if (res.status === 404 || res.status === 405) {
    const r = await reason(res);
    if (res.status === 405 || /no api route/i.test(r.message) || r.code === '') throw new UploadUnavailableError();
    throw new ServerError(`upload refused: ${r.message}`);
  }
  if (res.status === 401) throw new ServerError(`upload refused: the server refused the token: ${(await reason(res)).message}`);
  if (!res.ok) throw new ServerError(`upload refused (${res.status}): ${(await reason(res)).message}`);
  const body = (await res.json().catch(() => null)) as { session?: { id?: unknown }; id?: unknown; url?: unknown } | null;
  const id = body?.session?.id ?? body?.id;
  return { id: typeof id === 'number' ? id : null, url: typeof body?.url === 'string' && /^https?:\/\//.test(body.url) ? body.url : null };
}

/** The upload's sample packing is shared with the Bench page and the server. */
export { packSamples } from '../shared/link-engine/sample-pack';

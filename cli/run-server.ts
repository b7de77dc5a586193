// The runner's side of the server: the core under test (model, limits, link profile) read with
// a personal API token, and the session upload. Errors are one line, for exit status 2.
import { z } from 'zod';
import { errorReply } from '../shared/contract/common';
import { isCrc8Name, type Crc8Name } from '../shared/link';
import { parseModelConfig, type ModelConfig } from '../shared/numeric';
import { parseVectorConfig, type VectorConfig } from '../shared/vectoring';
import { multipartBody } from './multipart-body';
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

interface ServerCoreCommon {
  id: number;
  slug: string;
  name: string;
  limits: Limits;
  baud: number | null;
  crc: Crc8Name | null;
}

/** A core as the runner reads it: a rotation core's model, or a vectoring core's configuration. */
export type ServerCore = ServerCoreCommon & ({ mode: 'rotation'; model: ModelConfig } | { mode: 'vectoring'; vectorConfig: VectorConfig });

const coreRow = z.object({
  id: z.number().int(),
  slug: z.string(),
  name: z.string(),
  mode: z.string().optional(),
  modelConfig: z.unknown(),
  vectorConfig: z.unknown().optional(),
  limits: z.unknown(),
  linkProfile: z.object({ baud: z.number().int().optional(), crc: z.string().optional() }).partial().nullish(),
});

const CALL_TIMEOUT_MS = 15_000;
/** An upload's time-out grows with its size: the server scores every sample before it answers. */
const UPLOAD_MS_PER_MIB = 2_000;

async function call(fetchImpl: Fetch, url: string, init: RequestInit, what: string, timeoutMs = CALL_TIMEOUT_MS): Promise<Response> {
  try {
    return await fetchImpl(url, { ...init, signal: AbortSignal.timeout(timeoutMs) });
  } catch (e) {
    const cause = (e as { cause?: { code?: string; message?: string } }).cause;
    throw new ServerError(`cannot reach the server for ${what} at ${url}: ${cause?.code ?? cause?.message ?? (e as Error).message}`);
  }
}

/** Every server error is the contract's errorReply, `{ error: { code, message } }`; else the status line. */
async function reason(res: Response): Promise<{ code: string; message: string }> {
  const text = await res.text().catch(() => '');
  try {
    const body = errorReply.safeParse(JSON.parse(text));
    if (body.success) return { code: body.data.error.code, message: body.data.error.message };
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
  // Servers before vectoring cores send no mode: every core of theirs rotates.
  const mode = row.mode ?? 'rotation';
  if (mode !== 'rotation' && mode !== 'vectoring') throw new ServerError(`core "${slug}" is a ${mode} core: this runner runs rotation and vectoring cores only`);
  const readConfig = <T>(parse: (input: unknown) => T, input: unknown): T => {
    try {
      return parse(input);
    } catch (e) {
      throw new ServerError(`core "${slug}" on the server has a ${mode === 'vectoring' ? 'vectoring' : 'model'} configuration this runner cannot use: ${(e as Error).message}`);
    }
  };
  const crc = row.linkProfile?.crc;
  const common: ServerCoreCommon = {
    id: row.id,
    slug: row.slug,
    name: row.name,
    limits: parseLimits(row.limits ?? {}, `core "${slug}" limits`),
    baud: row.linkProfile?.baud ?? null,
    crc: crc !== undefined && isCrc8Name(crc) ? crc : null,
  };
  return mode === 'vectoring'
    ? { ...common, mode, vectorConfig: readConfig(parseVectorConfig, row.vectorConfig ?? {}) }
    : { ...common, mode, model: readConfig(parseModelConfig, row.modelConfig) };
}

/** What the runner uploads: the session as JSON, the packed samples and the capture archive. */
export interface SessionUpload {
  session: Record<string, unknown>;
  /**
   * Answered results in request order, little-endian i32: (angle code, cos, sin) triples for a
   * rotation core, (x, y, angle, magnitude) records for a vectoring core.
   */
  samples: Uint8Array;
  archive: Uint8Array;
}

/**
 * POST /api/sessions as multipart/form-data (fields `session`, JSON; files `samples`, `archive`).
 * Returns the new session's id and the address people open it at (the server's PUBLIC_URL),
 * when the server names them.
 */
export async function uploadSession(fetchImpl: Fetch, server: { url: string; token: string }, upload: SessionUpload): Promise<{ id: number | null; url: string | null }> {
  const multipart = multipartBody([
    { name: 'session', value: JSON.stringify(upload.session) },
    { name: 'samples', filename: 'samples.bin', type: 'application/octet-stream', bytes: upload.samples },
    { name: 'archive', filename: 'capture.abrc', type: 'application/octet-stream', bytes: upload.archive },
  ]);
  const url = `${server.url}/api/sessions`;
  const timeoutMs = CALL_TIMEOUT_MS + Math.ceil((upload.samples.length + upload.archive.length) / 2 ** 20) * UPLOAD_MS_PER_MIB;
  // Node's fetch takes an async iterable as a body, sent once `duplex: 'half'` allows it
  // (WHATWG fetch); the DOM's RequestInit type lists neither.
  const init = {
    method: 'POST',
    headers: { authorization: `Bearer ${server.token}`, 'content-type': multipart.contentType, 'content-length': String(multipart.length) },
    body: multipart.chunks(),
    duplex: 'half',
  };
  const res = await call(fetchImpl, url, init as unknown as RequestInit, 'the upload', timeoutMs);
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
export { packVectorSamples } from '../shared/link-engine/vector-sample-pack';

/** The session's `transport`: how the runner reached the board. */
export function transportOf(o: { device: string }, baud: number, crc: Crc8Name): Record<string, unknown> {
  return { kind: o.device.startsWith('ws') ? 'websocket' : 'serial', device: o.device, baud, crc };
}

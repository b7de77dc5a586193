// The end of a judged run, for both core modes: the report on stdout, the session upload when
// --server was given (the verdict is printed first, so a refused upload cannot hide what the
// board did), then the JUnit file with the saved session's address.
import { writeFileSync } from 'node:fs';
import type { CliIo } from './io';
import type { RunOptions } from './run-options';
import { uploadSession, type Fetch, type ServerCore, type SessionUpload } from './run-server';

export interface RunOutcome {
  o: RunOptions;
  io: CliIo;
  fetchImpl: Fetch;
  /** The server's core; null when the run was not given --server. */
  core: ServerCore | null;
  /** The human report. */
  human: string;
  /** The JSON summary, with what became of the upload. */
  json: (upload: { sessionId: number | null } | null) => Record<string, unknown>;
  /** The upload, built only when one is made. */
  upload: () => SessionUpload;
  /** The JUnit document for the session's address. */
  junit: (sessionUrl: string | null) => string;
  writeFile?: (path: string, bytes: Uint8Array) => void;
}

/** Prints, uploads and writes the JUnit file; @throws the upload's ServerError after printing the verdict. */
export async function publishRun(r: RunOutcome): Promise<void> {
  const { o, io } = r;
  const writeJunit = (sessionUrl: string | null) => {
    if (!o.junit) return;
    try {
      (r.writeFile ?? writeFileSync)(o.junit, new TextEncoder().encode(r.junit(sessionUrl)));
    } catch (e) {
      throw new Error(`cannot write the JUnit report to ${o.junit}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
  };
  if (!(o.server && r.core)) {
    io.stdout(o.json ? JSON.stringify(r.json(null), null, 2) + '\n' : r.human);
    writeJunit(null);
    return;
  }
  if (!o.json) io.stdout(r.human);
  let sessionId: number | null;
  let sessionUrl: string | null;
  try {
    ({ id: sessionId, url: sessionUrl } = await uploadSession(r.fetchImpl, o.server, r.upload()));
  } catch (e) {
    if (o.json) io.stdout(JSON.stringify({ ...r.json(null), upload: { error: (e as Error).message } }, null, 2) + '\n');
    writeJunit(null); // the verdict stands without the session's address
    throw e;
  }
  // The server's own address for it (PUBLIC_URL), else the one the runner was given.
  const address = sessionId !== null ? (sessionUrl ?? `${o.server.url}/sessions/${sessionId}`) : null;
  if (o.json) io.stdout(JSON.stringify(r.json({ sessionId }), null, 2) + '\n');
  else io.stdout(`session uploaded${address !== null ? `: ${address}` : ''}\n`);
  writeJunit(address);
}

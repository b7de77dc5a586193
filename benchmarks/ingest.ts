// ingest: the runner's upload of a 1,048,576-sample session (POST /api/sessions, multipart, bearer
// token), which the server decodes, scores with the core's model, judges and stores, timed from
// request to 201 — on SQLite and on PostgreSQL in the same run. The server runs in a process of
// its own (server-process.ts), as it does beside a runner on another machine: the runner's side
// of the upload does not share the server's thread. Beside each: the same samples
// bytes inserted as one blob by that database's bare driver (sqlite3 into a WAL-mode file, pg
// into a bytea column of a fresh database).
import path from 'node:path';
import { uploadSession } from '../cli/run-server';
import { tempDatabase } from '../tests/support/temp-db';
import { BENCH_DIALECTS, bareDriver, type BenchDialect } from './bare-driver';
import type { BenchResult } from './report';
import { bigExhaustiveSamples } from './server-fixture';
import { startServerChild } from './server-child';
import { median, timeMs } from './timing';

const RUNS = 3;
const TARGET_RATIO = 3;

/** Milliseconds per bare INSERT of `bytes` as one blob into a fresh database of `dialect`. */
async function bareBlobInserts(dialect: BenchDialect, bytes: Uint8Array, runs: number): Promise<{ driver: string; times: number[] }> {
  const tmp = await tempDatabase({ dialect });
  const url = dialect === 'sqlite' ? `sqlite:${path.join(tmp.dir, 'bare.sqlite')}` : tmp.url;
  const db = await bareDriver(url);
  try {
    // SQLite with the app's own journal (server/db/connection.ts), so the two sides write the same way.
    if (dialect === 'sqlite') await db.query('PRAGMA journal_mode = WAL');
    await db.query(dialect === 'sqlite' ? 'CREATE TABLE blobs (id INTEGER PRIMARY KEY, samples BLOB NOT NULL)' : 'CREATE TABLE blobs (id serial PRIMARY KEY, samples bytea NOT NULL)');
    const insert = dialect === 'sqlite' ? 'INSERT INTO blobs (samples) VALUES (?)' : 'INSERT INTO blobs (samples) VALUES ($1)';
    const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const times: number[] = [];
    for (let i = 0; i < runs; i++) times.push(await timeMs(() => db.query(insert, [buf])));
    return { driver: db.name, times };
  } finally {
    await db.close();
    await tmp.cleanup();
  }
}

async function ingestOn(dialect: BenchDialect, samples: ReturnType<typeof bigExhaustiveSamples>): Promise<BenchResult> {
  const child = await startServerChild(dialect);
  const server = { url: child.ready.url, token: child.ready.token };
  try {
    const session = {
      coreSlug: child.ready.bigCoreSlug,
      build: null,
      board: null,
      plan: { kind: 'exhaustive' },
      startedAt: new Date().toISOString(),
      transport: { kind: 'websocket', device: 'bench', baud: 12_000_000, crc: 'CRC-8/SMBUS' },
    };
    // One untimed upload first: the server's code starts cold.
    await uploadSession(fetch, server, { session, samples: samples.packed, archive: new Uint8Array(0) });
    const times: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      let id: number | null = null;
      times.push(await timeMs(async () => ({ id } = await uploadSession(fetch, server, { session, samples: samples.packed, archive: new Uint8Array(0) }))));
      if (id === null) throw new Error('the upload returned no session id');
    }
    const bare = await bareBlobInserts(dialect, samples.packed, RUNS);
    const ms = median(times);
    console.log(`  ${dialect}: ${samples.packed.length.toLocaleString('en-US')} B of samples; uploads ${times.map((t) => t.toFixed(0)).join(', ')} ms; bare ${bare.driver} blob inserts ${bare.times.map((t) => t.toFixed(1)).join(', ')} ms`);
    return {
      // SQLite's figure keeps the name outside scripts read; PostgreSQL's is marked.
      name: dialect === 'sqlite' ? 'ingest' : `ingest@${dialect}`,
      value: ms,
      unit: 'ms per 1,048,576-sample upload',
      ratio: ms / median(bare.times),
      ratioOf: `upload time ÷ bare ${bare.driver} INSERT of the same bytes as one blob`,
      target: `ratio ≤ ${TARGET_RATIO}`,
      met: ms / median(bare.times) <= TARGET_RATIO,
    };
  } finally {
    await child.stop();
  }
}

export async function ingestBench(): Promise<BenchResult[]> {
  const samples = bigExhaustiveSamples();
  const results: BenchResult[] = [];
  for (const dialect of BENCH_DIALECTS) results.push(await ingestOn(dialect, samples));
  return results;
}

// ingest: the runner's upload of a 1,048,576-sample session (POST /api/sessions, multipart, bearer
// token), which the server decodes, scores with the core's model, judges and stores, timed from
// request to 201. Beside it: the same samples bytes inserted as one blob with bare sqlite3.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import { uploadSession } from '../cli/run-server';
import type { BenchResult } from './report';
import { bigExhaustiveSamples, startBenchServer } from './server-fixture';
import { median, timeMs } from './timing';

const RUNS = 3;
const TARGET_MS = 1500;

const run = (db: sqlite3.Database, sql: string, params: unknown[] = []) =>
  new Promise<void>((resolve, reject) => db.run(sql, params, (err) => (err ? reject(err) : resolve())));

/** Milliseconds per bare INSERT of `bytes` as one blob into a fresh WAL-mode SQLite file. */
async function bareBlobInserts(bytes: Uint8Array, runs: number): Promise<number[]> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-bench-'));
  const db = await new Promise<sqlite3.Database>((resolve, reject) => {
    const d = new sqlite3.Database(path.join(dir, 'bare.sqlite'), (err) => (err ? reject(err) : resolve(d)));
  });
  try {
    // The app's own pragmas (server/db/connection.ts), so the two sides write the same way.
    await run(db, 'PRAGMA journal_mode = WAL');
    await run(db, 'CREATE TABLE blobs (id INTEGER PRIMARY KEY, samples BLOB NOT NULL)');
    const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const times: number[] = [];
    for (let i = 0; i < runs; i++) times.push(await timeMs(() => run(db, 'INSERT INTO blobs (samples) VALUES (?)', [buf])));
    return times;
  } finally {
    await new Promise((r) => db.close(r));
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

export async function ingestBench(): Promise<BenchResult[]> {
  const samples = bigExhaustiveSamples();
  const server = await startBenchServer();
  try {
    const session = {
      coreSlug: server.bigCore.slug,
      build: null,
      board: null,
      plan: { kind: 'exhaustive' },
      startedAt: new Date().toISOString(),
      transport: { kind: 'websocket', device: 'bench', baud: 12_000_000, crc: 'CRC-8/SMBUS' },
    };
    const times: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      let id: number | null = null;
      times.push(await timeMs(async () => ({ id } = await uploadSession(fetch, { url: server.url, token: server.token }, { session, samples: samples.packed, archive: new Uint8Array(0) }))));
      if (id === null) throw new Error('the upload returned no session id');
    }
    const bare = await bareBlobInserts(samples.packed, RUNS);
    const ms = median(times);
    console.log(`  ${samples.packed.length.toLocaleString('en-US')} B of samples; uploads ${times.map((t) => t.toFixed(0)).join(', ')} ms; bare blob inserts ${bare.map((t) => t.toFixed(1)).join(', ')} ms`);
    return [
      {
        name: 'ingest',
        value: ms,
        unit: 'ms per 1,048,576-sample upload',
        ratio: ms / median(bare),
        ratioOf: 'upload time ÷ bare sqlite3 INSERT of the same bytes as one blob',
        target: `< ${TARGET_MS} ms`,
        met: ms < TARGET_MS,
      },
    ];
  } finally {
    await server.close();
  }
}

// The app server (as server-fixture.ts builds it, on the database named by its first argument:
// `sqlite`, the default, or `postgres`) in a child process of its own, as it runs in production:
// the client's work (the runner's upload, the page's fetch) then runs beside it, not on its
// thread, and the memory it reports is the server's alone. It tells its parent over IPC where it
// listens, and answers two questions: `mark` (collect garbage, reset the kernel's peak-RSS mark,
// answer the RSS now) and `peak` (the peak RSS since the last mark).
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { Core } from '../server/db/models';
import { bareDriver, type BenchDialect } from './bare-driver';
import { startBenchServer } from './server-fixture';
import { SCALE_CORE_CONFIG, type ServerReply, type ServerRequest } from './server-process-protocol';

/** VmHWM of /proc/self/status (Linux): the resident-set peak since the process began or the last reset. */
function peakRss(): number {
  const m = /^VmHWM:\s+(\d+) kB$/m.exec(readFileSync('/proc/self/status', 'utf8'));
  if (!m) throw new Error('no VmHWM in /proc/self/status: the peak memory needs Linux');
  return Number(m[1]) * 1024;
}

const dialect: BenchDialect = process.argv[2] === 'postgres' ? 'postgres' : 'sqlite';
const server = await startBenchServer(dialect);
const core = await Core.create({ name: 'Twenty-two-bit core', slug: 'bench-22', linkProfile: {}, modelConfig: SCALE_CORE_CONFIG, limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null });
const send = (m: ServerReply) => process.send!(m);

/** Collect garbage and reset the peak mark; the RSS now. */
function mark(): number {
  (globalThis as { gc?: () => void }).gc?.();
  // Writing 5 to clear_refs resets VmHWM to the RSS now (Linux ≥ 4.0).
  writeFileSync('/proc/self/clear_refs', '5');
  return process.memoryUsage().rss;
}

/** The baseline: the peak growth of the bare sqlite3 driver inserting `bytes` as one blob (WAL, as the app). */
async function bareInsertGrowth(bytes: number): Promise<number> {
  if (dialect !== 'sqlite') throw new Error('the bare insert growth is measured on SQLite');
  const db = await bareDriver(`sqlite:${path.join(path.dirname(server.t.config.databaseUrl.slice('sqlite:'.length)), 'bare-scale.sqlite')}`);
  try {
    await db.query('PRAGMA journal_mode = WAL');
    await db.query('CREATE TABLE IF NOT EXISTS blobs (id INTEGER PRIMARY KEY, samples BLOB NOT NULL)');
    const blob = Buffer.alloc(bytes, 0x5a);
    const rss = mark();
    await db.query('INSERT INTO blobs (samples) VALUES (?)', [blob]);
    return peakRss() - rss;
  } finally {
    await db.close();
  }
}

process.on('message', (m: ServerRequest) => {
  if (m.kind === 'mark') {
    const rss = mark();
    send({ kind: 'mark', rss, peak: peakRss() });
  } else if (m.kind === 'bare') {
    void bareInsertGrowth(m.bytes).then((growth) => send({ kind: 'bare', growth }));
  } else if (m.kind === 'peak') {
    send({ kind: 'peak', peak: peakRss() });
  } else {
    void server.close().then(() => process.exit(0));
  }
});
send({ kind: 'ready', url: server.url, token: server.token, coreSlug: core.slug, bigCoreSlug: server.bigCore.slug, dialect });

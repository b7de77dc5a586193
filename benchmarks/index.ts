// `npm run bench [-- NAME …]`: runs the benchmarks (all, or the ones named), prints each figure
// with its side-by-side ratio, and writes benchmarks/results/latest.json. Exit 1 if any target is
// missed, 2 for an unknown name or a benchmark that failed to run.
import { loadavg } from 'node:os';
import { needsPostgres, startBenchPostgres } from './postgres';
import { markdownTable, printResult, writeResults, type BenchResult } from './report';

type Bench = () => Promise<BenchResult[]>;

// Imported lazily: a benchmark's setup (a browser, a server) costs nothing unless it runs.
const BENCHES: Record<string, Bench> = {
  'decode-score': async () => (await import('./decode-score')).decodeScoreBench(),
  explain: async () => (await import('./explain')).explainBench(),
  'explain-vector': async () => (await import('./explain-vector')).explainVectorBench(),
  link: async () => (await import('./link')).linkBench(),
  'link-vector': async () => (await import('./link-vector')).linkVectorBench(),
  'hosted-board': async () => (await import('./hosted-board')).hostedBoardBench(),
  ingest: async () => (await import('./ingest')).ingestBench(),
  'list-compare': async () => (await import('./list-compare')).listCompareBench(),
  page: async () => (await import('./page')).pageBench(),
  'scale-page': async () => (await import('./scale-page')).scalePageBench(),
  station: async () => (await import('./station')).stationBench(),
  'vector-score': async () => (await import('./vector-score')).vectorScoreBench(),
  scale: async () => (await import('./scale')).scaleBench(),
  'hot-paths': async () => (await import('./hot-paths')).hotPathsBench(),
};

async function main(): Promise<number> {
  const asked = process.argv.slice(2).filter((a) => a !== '--');
  const unknown = asked.filter((n) => !(n in BENCHES));
  if (unknown.length > 0) {
    console.error(`bench: no benchmark named ${unknown.join(', ')}; known: ${Object.keys(BENCHES).join(', ')}`);
    return 2;
  }
  const names = asked.length > 0 ? asked : Object.keys(BENCHES);
  // Every figure here is wall time on a shared machine: say how busy it was.
  const load = () => loadavg().map((l) => l.toFixed(1)).join(' / ');
  // PostgreSQL runs only while the benchmarks that measure it do, so the others (hosted-board,
  // page, station) start their servers on SQLite, the product's default, as when run alone.
  let stopPostgres: (() => Promise<void>) | null = null;
  const results: BenchResult[] = [];
  let failed = false;
  for (const [i, name] of names.entries()) {
    console.log(`\n== ${name}   (load average ${load()})`);
    const t0 = performance.now();
    try {
      if (needsPostgres(name)) stopPostgres ??= await startBenchPostgres();
      const rs = await BENCHES[name]();
      for (const r of rs) printResult(r);
      results.push(...rs);
    } catch (e) {
      failed = true;
      console.error(`bench ${name} failed: ${(e as Error).stack ?? String(e)}`);
    }
    console.log(`(${name}: ${((performance.now() - t0) / 1000).toFixed(1)} s)`);
    if (stopPostgres && !names.slice(i + 1).some(needsPostgres)) {
      await stopPostgres();
      stopPostgres = null;
    }
  }
  console.log(`\n${markdownTable(results)}\n\nwrote ${writeResults(results)}`);
  if (failed) return 2;
  return results.some((r) => r.met === false) ? 1 : 0;
}

// Exit explicitly: a benchmark that left a handle open must not keep the suite alive.
process.exit(await main());

// Raw line traffic. Drained a few times a second (in the page's frame slots) with a budget of
// lines, so a fast run cannot flood the page; the kept lines are bounded, and only the
// rows in view exist in the page (TrafficView). Their plain text (TrafficLines) serves find and copy.
import { useEffect, useRef, useState } from 'react';
import type { TrafficLog } from '../live/traffic-log';
import { slotGate } from '../live/frame-slot';
import { TrafficLines } from '../live/traffic-lines';
import { C, copyOrDownload, formatTraffic } from './traffic-format';
import { TrafficView } from './traffic-view';
import { btn, input, panel, panelTitle } from '../../../components/ui';

const KEPT_LINES = 5000;
/**
 * Lines kept per frame slot, and hex rows per chunk of bytes: at full speed a chunk holds
 * thousands of bytes, and its first rows (then how many more) leave room for the frames decoded
 * from it. Only the rows in view are ever built in the page, so kept lines cost only their text.
 */
const LINES_PER_WRITE = 200;
const ROWS_PER_CHUNK = 16;

export function TrafficPane({ log }: { log: TrafficLog }) {
  const box = useRef<HTMLDivElement>(null);
  const view = useRef<TrafficView | null>(null);
  const [lines] = useState(() => new TrafficLines(KEPT_LINES));
  const paused = useRef(false);
  const [isPaused, setPaused] = useState(false);
  const [query, setQuery] = useState('');
  const [hit, setHit] = useState<{ line: number; index: number; total: number } | null | 'none'>(null);
  const [copyNote, setCopyNote] = useState('');

  useEffect(() => {
    const v = new TrafficView(box.current!, lines);
    view.current = v;
    v.render(true);
    const ro = new ResizeObserver(() => v.render(false));
    ro.observe(box.current!);
    let raf = 0;
    const due = slotGate();
    const tick = (now: number) => {
      // Written in the frames the charts and figures change in, within a budget of lines: what is
      // past it is counted, not formatted.
      if (due(now) && !paused.current) {
        const { entries, dropped } = log.drain();
        const out: string[] = [];
        let skipped = dropped;
        for (const e of entries) {
          if (out.length >= LINES_PER_WRITE) skipped++;
          else out.push(...formatTraffic(e, ROWS_PER_CHUNK));
        }
        if (skipped) out.push(`${C.dim}… ${skipped.toLocaleString('en-US')} entries not shown (traffic faster than the pane)${C.off}`);
        if (out.length) {
          const follow = v.atEnd;
          v.push(out);
          v.render(follow);
        }
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => {
      cancelAnimationFrame(raf);
      ro.disconnect();
      v.dispose();
      view.current = null;
    };
  }, [log, lines]);

  /** Bring line `n`'s hit into view, marked. */
  const show = (n: number, column: number) => view.current?.show(n, column, query.length);

  const find = (direction: 1 | -1) => {
    const from = hit && hit !== 'none' ? hit.line : direction === 1 ? -1 : lines.written;
    const found = lines.find(query, from, direction);
    if (!found) return setHit('none');
    setHit({ line: found.line, ...lines.count(query, found.line) });
    show(found.line, found.column);
  };

  const copy = async (what: 'visible' | 'all') => {
    const text = what === 'visible' && view.current ? view.current.visibleText() : lines.text();
    const how = await copyOrDownload(text, 'line-traffic.txt');
    setCopyNote(how === 'copied' ? `Copied ${what === 'all' ? 'the kept traffic' : 'the visible lines'}.` : 'The clipboard is not available here, so the text was downloaded as line-traffic.txt.');
  };

  return (
    <section aria-labelledby="traffic-title" className={`${panel} min-w-0`}>
      <div className="mb-2 flex flex-wrap items-center gap-2">
        <h2 id="traffic-title" className={`${panelTitle} mb-0 mr-auto`}>
          Line traffic
        </h2>
        <button
          type="button"
          className={btn}
          aria-pressed={isPaused}
          onClick={() => {
            paused.current = !paused.current;
            // While paused the bounded queue keeps only the newest entries; the pane shows a gap.
            if (paused.current) log.drain();
            setPaused(paused.current);
          }}
        >
          {/* One name whatever the state (aria-pressed tells it), and not the run's own Pause. */}
          Freeze traffic view
        </button>
        <button
          type="button"
          className={btn}
          onClick={() => {
            view.current?.clear();
            setHit(null);
          }}
        >
          Clear
        </button>
        <button type="button" className={btn} onClick={() => void copy('visible')}>
          Copy visible
        </button>
        <button type="button" className={btn} onClick={() => void copy('all')}>
          Copy all
        </button>
      </div>
      <form
        role="search"
        aria-label="Traffic search"
        className="mb-2 flex items-center gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          find(1);
        }}
      >
        <input
          aria-label="Find in traffic"
          className={`${input} min-w-0 flex-1 py-1 font-mono text-xs`}
          value={query}
          placeholder="bytes (a5 90) or words (RESULTS, tag 12)"
          onChange={(e) => {
            setQuery(e.target.value);
            setHit(null);
          }}
          onKeyDown={(e) => {
            if (e.key === 'Enter' && e.shiftKey) {
              e.preventDefault();
              find(-1);
            }
          }}
        />
        <button type="button" className={btn} disabled={!query} onClick={() => find(-1)} aria-label="Previous match">
          ↑
        </button>
        <button type="submit" className={btn} disabled={!query} aria-label="Next match">
          ↓
        </button>
        <span className="min-w-16 text-xs text-ink-soft" aria-live="polite" data-testid="traffic-find-status">
          {hit === 'none' ? 'Not found' : hit ? `${hit.index} of ${hit.total}` : ''}
        </span>
      </form>
      {/* Focusable, so the kept lines scroll from the keyboard too. */}
      <div ref={box} role="region" aria-label="Kept traffic" tabIndex={0} className="relative h-64 min-w-0 overflow-auto rounded bg-ink p-1 font-mono text-xs leading-4 text-paper" />
      <p className="mt-1 min-h-4 text-xs text-ink-soft" aria-live="polite">
        {copyNote}
      </p>
    </section>
  );
}

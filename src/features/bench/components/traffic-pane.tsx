// Raw line traffic in an xterm. Drained a few times a second with a line budget, so a fast run
// cannot flood the page; the scroll-back is bounded, and a plain-text copy of it (TrafficLines)
// serves find and copy.
import { FitAddon } from '@xterm/addon-fit';
import { Terminal } from '@xterm/xterm';
import '@xterm/xterm/css/xterm.css';
import { useEffect, useRef, useState } from 'react';
import type { TrafficLog } from '../live/traffic-log';
import { TrafficLines } from '../live/traffic-lines';
import { C, copyOrDownload, formatTraffic } from './traffic-format';
import { btn, input, panel, panelTitle } from '../../../components/ui';

const SCROLLBACK_LINES = 5000;
const WRITE_EVERY_MS = 200;
const LINES_PER_WRITE = 200;

export function TrafficPane({ log }: { log: TrafficLog }) {
  const box = useRef<HTMLDivElement>(null);
  const term = useRef<Terminal | null>(null);
  const [lines] = useState(() => new TrafficLines(SCROLLBACK_LINES));
  const paused = useRef(false);
  const [isPaused, setPaused] = useState(false);
  const [query, setQuery] = useState('');
  const [hit, setHit] = useState<{ line: number; index: number; total: number } | null | 'none'>(null);
  const [copyNote, setCopyNote] = useState('');

  useEffect(() => {
    const t = new Terminal({
      scrollback: SCROLLBACK_LINES,
      fontFamily: '"JetBrains Mono", monospace',
      fontSize: 12,
      disableStdin: true,
      convertEol: true,
      // Every colour the traffic uses (traffic-format.ts) at 4.5:1 or more on the dark ground (WCAG AA).
      theme: { background: '#1f2a2e', foreground: '#f6f3ec', cursor: '#1f2a2e', selectionBackground: '#e0b84a', selectionForeground: '#1f2a2e', brightBlack: '#a3aeb2', red: '#f08a78', green: '#8cc46b', yellow: '#e0b84a', cyan: '#6cc7bd' },
    });
    const fit = new FitAddon();
    t.loadAddon(fit);
    t.open(box.current!);
    fit.fit();
    term.current = t;
    const ro = new ResizeObserver(() => fit.fit());
    ro.observe(box.current!);
    let raf = 0;
    let lastWrite = 0;
    const tick = (now: number) => {
      if (!paused.current && now - lastWrite >= WRITE_EVERY_MS) {
        lastWrite = now;
        const { entries, dropped } = log.drain();
        const out: string[] = [];
        let skipped = dropped;
        for (const e of entries) {
          if (out.length >= LINES_PER_WRITE) skipped++;
          else out.push(...formatTraffic(e));
        }
        if (skipped) out.push(`${C.dim}… ${skipped.toLocaleString('en-US')} entries not shown (traffic faster than the pane)${C.off}`);
        for (const l of out) lines.push(l);
        if (out.length) t.write(out.join('\r\n') + '\r\n');
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => {
      cancelAnimationFrame(raf);
      ro.disconnect();
      t.dispose();
      term.current = null;
    };
  }, [log, lines]);

  /** Select line `n`'s hit in the terminal and scroll it into view. */
  const show = (n: number, column: number) => {
    const t = term.current;
    if (!t) return;
    // The terminal holds the last scrollback + rows lines (plus the empty cursor line).
    const trimmed = Math.max(0, lines.written + 1 - (SCROLLBACK_LINES + t.rows));
    const row = n - trimmed;
    t.scrollToLine(Math.max(0, row - Math.floor(t.rows / 2)));
    t.select(column, row, query.length);
  };

  const find = (direction: 1 | -1) => {
    const from = hit && hit !== 'none' ? hit.line : direction === 1 ? -1 : lines.written;
    const found = lines.find(query, from, direction);
    if (!found) return setHit('none');
    setHit({ line: found.line, ...lines.count(query, found.line) });
    show(found.line, found.column);
  };

  const copy = async (what: 'visible' | 'all') => {
    const t = term.current;
    let text = lines.text();
    if (what === 'visible' && t) {
      const b = t.buffer.active;
      const rows: string[] = [];
      for (let y = b.viewportY; y < b.viewportY + t.rows; y++) rows.push(b.getLine(y)?.translateToString(true) ?? '');
      text = rows.join('\n').trimEnd();
    }
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
          {isPaused ? 'Resume' : 'Pause'}
        </button>
        <button
          type="button"
          className={btn}
          onClick={() => {
            term.current?.reset();
            lines.clear();
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
      <div ref={box} className="h-64 min-w-0 overflow-hidden rounded bg-ink p-1" />
      <p className="mt-1 min-h-4 text-xs text-ink-soft" aria-live="polite">
        {copyNote}
      </p>
    </section>
  );
}

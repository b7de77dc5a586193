// Raw line traffic in an xterm: hex and ASCII by direction, with decoded frames and decoder
// events in between. Drained once per animation frame with a line budget, so a fast run cannot
// flood the page; the scroll-back is bounded.
import { FitAddon } from '@xterm/addon-fit';
import { Terminal } from '@xterm/xterm';
import '@xterm/xterm/css/xterm.css';
import { useEffect, useRef, useState } from 'react';
import { kindName } from '../../../../shared/link';
import type { TrafficEntry, TrafficLog } from '../session/traffic-log';
import { btn, panel, panelTitle } from '../../../components/ui';

const SCROLLBACK_LINES = 5000;
const LINES_PER_FRAME = 120;
const C = { dim: '\x1b[90m', tx: '\x1b[33m', rx: '\x1b[36m', frame: '\x1b[32m', warn: '\x1b[31m', off: '\x1b[0m' };

const stamp = (atMs: number) => {
  const d = new Date(performance.timeOrigin + atMs);
  return `${d.toTimeString().slice(0, 8)}.${String(d.getMilliseconds()).padStart(3, '0')}`;
};
const hex = (b: number) => b.toString(16).padStart(2, '0');

function format(e: TrafficEntry): string[] {
  const t = `${C.dim}${stamp(e.atMs)}${C.off}`;
  if (e.type === 'note') return [`${t} ${C.warn}! ${e.text}${C.off}`];
  if (e.type === 'skip') return [`${t} ${C.warn}! skipped ${e.event.bytes} B (${e.event.reason}) at ${e.event.offset}${C.off}`];
  if (e.type === 'frame') return [`${t} ${C.frame}  ⇐ ${kindName(e.frame.kind)} tag ${e.frame.tag}, ${e.frame.payload.length} B payload${C.off}`];
  const out: string[] = [];
  const col = e.direction === 'tx' ? C.tx : C.rx;
  const arrow = e.direction === 'tx' ? 'TX →' : 'RX ←';
  for (let at = 0; at < e.bytes.length; at += 16) {
    const row = e.bytes.subarray(at, at + 16);
    const h = Array.from(row, hex).join(' ').padEnd(47);
    const a = Array.from(row, (b) => (b >= 0x20 && b < 0x7f ? String.fromCharCode(b) : '.')).join('');
    out.push(`${at === 0 ? t : ' '.repeat(12)} ${col}${at === 0 ? arrow : '    '}${C.off} ${h}  ${C.dim}${a}${C.off}`);
  }
  return out;
}

export function TrafficPane({ log }: { log: TrafficLog }) {
  const box = useRef<HTMLDivElement>(null);
  const term = useRef<Terminal | null>(null);
  const paused = useRef(false);
  const [isPaused, setPaused] = useState(false);

  useEffect(() => {
    const t = new Terminal({
      scrollback: SCROLLBACK_LINES,
      fontFamily: '"JetBrains Mono", monospace',
      fontSize: 12,
      disableStdin: true,
      convertEol: true,
      theme: { background: '#1f2a2e', foreground: '#f6f3ec', cursor: '#1f2a2e' },
    });
    const fit = new FitAddon();
    t.loadAddon(fit);
    t.open(box.current!);
    fit.fit();
    term.current = t;
    const ro = new ResizeObserver(() => fit.fit());
    ro.observe(box.current!);
    let raf = 0;
    const tick = () => {
      if (!paused.current) {
        const { entries, dropped } = log.drain();
        const lines: string[] = [];
        let skipped = dropped;
        for (const e of entries) {
          if (lines.length >= LINES_PER_FRAME) skipped++;
          else lines.push(...format(e));
        }
        if (skipped) lines.push(`${C.dim}… ${skipped.toLocaleString('en-US')} entries not shown (traffic faster than the pane)${C.off}`);
        if (lines.length) t.write(lines.join('\r\n') + '\r\n');
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
  }, [log]);

  return (
    <section aria-labelledby="traffic-title" className={`${panel} min-w-0`}>
      <div className="mb-2 flex items-center gap-2">
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
        <button type="button" className={btn} onClick={() => term.current?.clear()}>
          Clear
        </button>
      </div>
      <div ref={box} className="h-64 min-w-0 overflow-hidden rounded bg-ink p-1" />
    </section>
  );
}

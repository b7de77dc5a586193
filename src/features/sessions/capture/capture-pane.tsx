// The session's capture in an xterm: browsed a page of records at a time, or replayed at the
// pace it was recorded (faster if asked), with a Stop. A status line outside the terminal says
// in words what it shows, for screen readers and for anyone waiting on a replay.
import { FitAddon } from '@xterm/addon-fit';
import { Terminal } from '@xterm/xterm';
import '@xterm/xterm/css/xterm.css';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { ArchiveRecord, Direction } from '../../../../shared/link';
import { btn, input, label, panel, panelTitle } from '../../../components/ui';
import { useSessionCapture, type SessionCapture } from '../api/get-session-capture';
import { C, profilesByRecord, recordLines } from './capture-lines';
import { dueUntil, REPLAY_SPEEDS } from './replay-clock';
import { recordedAt, replayTimeline, SILENCE_MS } from './replay-timeline';
import { captureLabelText } from './capture-label';
import { DIRECTION_WORDS, recheckMatches, recheckText } from './capture-recheck';
import { framesBefore, STATUS_EVERY_MS, statusText } from './replay-status';
import { terminalTheme } from '../../../components/terminal-theme';

const PAGE_RECORDS = 300;
const seconds = (ms: number) => `${(ms / 1000).toLocaleString('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 })} s`;
const LINES_PER_FRAME = 200;
type Which = 'both' | Direction;

export function CapturePane({ sessionId, hasArchive }: { sessionId: number; hasArchive: boolean }) {
  const [open, setOpen] = useState(false);
  const capture = useSessionCapture(sessionId, open && hasArchive);
  return (
    <section aria-labelledby="capture-title" className={`${panel} min-w-0`}>
      <h2 id="capture-title" className={panelTitle}>
        Recorded capture
      </h2>
      {!hasArchive ? (
        <p className="text-sm text-ink-soft">No capture was uploaded with this session.</p>
      ) : !open ? (
        <button type="button" className={btn} onClick={() => setOpen(true)}>
          Open capture
        </button>
      ) : capture.isPending ? (
        <p className="text-sm text-ink-soft">Reading the capture…</p>
      ) : capture.isError ? (
        <p role="alert" className="text-sm font-bold text-fail">
          The capture could not be read: {capture.error.message}
        </p>
      ) : (
        <CaptureTerminal capture={capture.data} />
      )}
    </section>
  );
}

function CaptureTerminal({ capture }: { capture: SessionCapture }) {
  const { archive } = capture;
  const [which, setWhich] = useState<Which>('both');
  const [page, setPage] = useState(0);
  const [speed, setSpeed] = useState<number>(1);
  // Captures from the Bench page can sit silent for minutes between INFO and the run.
  const [skipSilences, setSkipSilences] = useState(true);
  // 'stopped' / 'finished': a replay's output stays until the next browse.
  const [mode, setMode] = useState<'browse' | 'replaying' | 'stopped' | 'finished'>('browse');
  const replaying = mode === 'replaying';
  // How far a replay has come: `live` every tick, `progress` (the status line) now and then.
  const live = useRef({ framesShown: 0, recordsShown: 0, elapsedS: 0 });
  const [progress, setProgress] = useState(live.current);
  const box = useRef<HTMLDivElement>(null);
  const term = useRef<Terminal | null>(null);

  const all = archive.records;
  const profiles = useMemo(() => profilesByRecord(all, archive.header.profile), [all, archive.header.profile]);
  const t0 = all[0]?.timeMs ?? 0;
  const shown = useMemo(() => all.map((r, i) => [r, i] as const).filter(([r]) => which === 'both' || r.direction === which), [all, which]);
  const pages = Math.max(1, Math.ceil(shown.length / PAGE_RECORDS));
  const frameCounts = useMemo(() => framesBefore(shown.map(([r]) => r)), [shown]);
  const shownDurationS = shown.length ? (shown[shown.length - 1][0].timeMs - t0) / 1000 : 0;
  const linesOf = (r: ArchiveRecord, i: number) => recordLines(r, t0, profiles[i]);
  const browse = (w: Which, p: number) => {
    setWhich(w);
    setPage(p);
    setMode('browse');
  };

  useEffect(() => {
    const t = new Terminal({ scrollback: 20_000, fontFamily: '"JetBrains Mono", monospace', fontSize: 12, disableStdin: true, convertEol: true, theme: terminalTheme });
    const fit = new FitAddon();
    t.loadAddon(fit);
    t.open(box.current!);
    fit.fit();
    term.current = t;
    // Fitting needs a rendered terminal: skip a resize that lands after disposal.
    const ro = new ResizeObserver(() => term.current === t && fit.fit());
    ro.observe(box.current!);
    return () => {
      ro.disconnect();
      t.dispose();
      term.current = null;
    };
  }, []);

  // Browsing: one page of records.
  useEffect(() => {
    const t = term.current;
    if (!t || mode !== 'browse') return;
    t.reset();
    const slice = shown.slice(page * PAGE_RECORDS, (page + 1) * PAGE_RECORDS);
    // Writes are asynchronous: scroll once this page has landed.
    t.write(slice.flatMap(([r, i]) => linesOf(r, i)).join('\r\n') + '\r\n', () => term.current === t && t.scrollToTop());
    // linesOf depends only on what is listed here.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [shown, page, mode, profiles]);

  // Replay: records appear when their recorded time (scaled by speed) comes round.
  useEffect(() => {
    const t = term.current;
    if (!t || !replaying) return;
    t.reset();
    t.write(`${C.dim}Replaying ${shown.length.toLocaleString('en-US')} records at ${speed}× recorded pace${skipSilences ? `, silences over ${SILENCE_MS / 1000} s shortened to ${SILENCE_MS / 1000} s` : ''}…${C.off}\r\n`);
    const line = replayTimeline(
      shown.map(([r]) => r.timeMs),
      t0,
      skipSilences ? SILENCE_MS : Infinity,
    );
    const start = performance.now();
    let next = 0;
    let raf = 0;
    let statusAt = -Infinity;
    const tick = () => {
      const now = performance.now();
      const playMs = (now - start) * speed;
      const due = dueUntil(line.play, next, 0, now - start, speed);
      const lines: string[] = [];
      let hidden = 0;
      const sayHidden = () => {
        if (hidden) lines.push(`${C.dim}… ${hidden.toLocaleString('en-US')} records not shown (faster than the pane at this speed)${C.off}`);
        hidden = 0;
      };
      for (; next < due; next++) {
        // A skipped silence is always said, even in a tick with more records than the pane shows.
        if (line.skippedBefore[next]) {
          sayHidden();
          lines.push(`${C.dim}… ${seconds(line.skippedBefore[next])} without traffic, skipped …${C.off}`);
        }
        if (lines.length >= LINES_PER_FRAME) hidden++;
        else lines.push(...linesOf(...shown[next]));
      }
      sayHidden();
      if (lines.length) t.write(lines.join('\r\n') + '\r\n');
      // The status line counts recorded time, skipped silences included.
      live.current = { framesShown: frameCounts[next], recordsShown: next, elapsedS: recordedAt(line, next, playMs) / 1000 };
      if (next >= shown.length) {
        t.write(`${C.dim}End of the capture.${C.off}\r\n`);
        setProgress(live.current);
        setMode('finished');
        return;
      }
      if (now - statusAt >= STATUS_EVERY_MS) {
        statusAt = now;
        setProgress(live.current);
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [mode]);

  const startReplay = () => {
    live.current = { framesShown: 0, recordsShown: 0, elapsedS: 0 };
    setProgress(live.current);
    setMode('replaying');
  };
  const stopReplay = () => {
    setProgress(live.current);
    setMode('stopped');
  };
  const phase = mode === 'browse' ? 'idle' : mode;
  const status = statusText({ phase, ...progress, skipSilences, framesTotal: frameCounts[shown.length], records: shown.length, durationS: shownDurationS, speed, direction: which === 'both' ? undefined : DIRECTION_WORDS[which] });

  const matches = recheckMatches(capture);
  const durationS = all.length ? (all[all.length - 1].timeMs - t0) / 1000 : 0;
  return (
    <div className="grid gap-2">
      <p className="text-sm">
        <span className="font-mono">{capture.bytes.toLocaleString('en-US')} B</span>, {all.length.toLocaleString('en-US')} records over {durationS.toFixed(3)} s; {archive.header.crc}, {archive.header.profile.angleFormat} {archive.header.profile.angleBits}-bit angles, {archive.header.profile.outBits}-bit outputs
        {archive.header.label && <> — {captureLabelText(archive.header.label)}</>}.
      </p>
      <p data-testid="capture-recheck" className={`text-sm ${matches ? 'text-pass' : 'font-bold text-fail'}`}>
        {recheckText(capture)}
      </p>
      <div className="flex flex-wrap items-end gap-2">
        <label className={label}>
          Direction
          <select className={input} value={which} disabled={replaying} onChange={(e) => browse(e.target.value as Which, 0)}>
            <option value="both">Both</option>
            <option value="to-device">To the device (TX)</option>
            <option value="to-host">From the device (RX)</option>
          </select>
        </label>
        <div className="flex items-center gap-1" role="group" aria-label="Pages of records">
          <button type="button" className={btn} disabled={replaying || page === 0} onClick={() => browse(which, page - 1)}>
            Earlier
          </button>
          <span className="px-2 text-sm tabular-nums" aria-live="polite">
            {shown.length ? `${(page * PAGE_RECORDS + 1).toLocaleString('en-US')}–${Math.min(shown.length, (page + 1) * PAGE_RECORDS).toLocaleString('en-US')} of ${shown.length.toLocaleString('en-US')}` : 'no records'}
          </span>
          <button type="button" className={btn} disabled={replaying || page >= pages - 1} onClick={() => browse(which, page + 1)}>
            Later
          </button>
        </div>
        {/* Speed and the replay buttons wrap as one group, so Replay never lands alone on a line. */}
        <div className="ml-auto flex flex-wrap items-end gap-2">
          <label className={label}>
            Replay speed
            <select className={input} value={speed} disabled={replaying} onChange={(e) => setSpeed(Number(e.target.value))}>
              {REPLAY_SPEEDS.map((s) => (
                <option key={s} value={s}>
                  {s === 1 ? 'as recorded' : `${s}× faster`}
                </option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-1 py-1.5 text-sm">
            <input type="checkbox" checked={skipSilences} disabled={replaying} onChange={(e) => setSkipSilences(e.target.checked)} />
            Skip silences
          </label>
          {(mode === 'stopped' || mode === 'finished') && (
            <button type="button" className={btn} onClick={() => setMode('browse')}>
              Back to the records
            </button>
          )}
          {replaying ? (
            <button type="button" className={btn} onClick={stopReplay}>
              Stop
            </button>
          ) : (
            <button type="button" className={btn} disabled={!shown.length} onClick={startReplay}>
              Replay
            </button>
          )}
        </div>
      </div>
      <p role="status" aria-atomic="true" className={`text-sm tabular-nums ${replaying ? 'font-bold text-ink' : 'text-ink-soft'}`}>
        {status}
      </p>
      <div ref={box} data-testid="capture-terminal" className="h-72 min-w-0 overflow-hidden rounded bg-ink p-1" />
    </div>
  );
}

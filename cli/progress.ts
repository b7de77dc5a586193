// Run progress on stderr (stdout stays clean for --json): a bar redrawn in place on a terminal,
// a plain line every second otherwise (CI logs keep every line).
import type { RunProgress } from '../shared/link-engine/link-figures';

export interface ProgressSink {
  update(p: RunProgress): void;
  /** The given or latest state if not shown yet, then a line end on a terminal. */
  end(p: RunProgress | null): void;
}

const BAR_WIDTH = 28;
const TTY_EVERY_MS = 100;
const PLAIN_EVERY_MS = 1000;

function describe(p: RunProgress, unit: string): string {
  const pct = p.total > 0 ? Math.floor((100 * p.done) / p.total) : 0;
  const rate = p.ratePerS > 0 ? `${Math.round(p.ratePerS).toLocaleString('en-US')}/s` : '—/s';
  const eta = p.etaS === null ? '' : `, ${p.etaS.toFixed(1)} s left`;
  const missing = p.missing > 0 ? `, ${p.missing} missing` : '';
  return `${String(pct).padStart(3)}% ${p.done.toLocaleString('en-US')}/${p.total.toLocaleString('en-US')} ${unit}, ${rate}${eta}${missing}`;
}

/**
 * @param write  where the text goes (stderr)
 * @param isTty  redraw in place when true
 * @param nowMs  the caller's clock
 * @param unit   what a run asks about: angle codes, or a vectoring core's vectors
 */
export function progressSink(write: (text: string) => void, isTty: boolean, nowMs: () => number, unit: 'codes' | 'vectors' = 'codes'): ProgressSink {
  let lastAt = -Infinity;
  let drawn = false;
  let latest: RunProgress | null = null;
  let latestDrawn = false;
  const draw = (p: RunProgress) => {
    if (isTty) {
      const filled = p.total > 0 ? Math.round((BAR_WIDTH * p.done) / p.total) : 0;
      write(`\r[${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${describe(p, unit)}\x1b[K`);
    } else write(`progress: ${describe(p, unit)}\n`);
    drawn = true;
  };
  return {
    update(p) {
      latest = p;
      latestDrawn = false;
      const now = nowMs();
      if (now - lastAt < (isTty ? TTY_EVERY_MS : PLAIN_EVERY_MS)) return;
      lastAt = now;
      draw(p);
      latestDrawn = true;
    },
    end(p) {
      const last = p ?? (latestDrawn ? null : latest);
      if (last) draw(last);
      if (drawn && isTty) write('\n');
    },
  };
}

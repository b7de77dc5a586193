// Words and looks for build figures, one way each across the builds pages.
import type { BuildStatus } from '../../../lib/resources/builds';

export const STATUS_LOOK: Record<BuildStatus, { words: string; hint: string; className: string }> = {
  untested: { words: 'untested', hint: 'No session has run on this build yet.', className: 'border-rule bg-paper text-ink-soft' },
  passing: { words: 'passing', hint: 'Its latest session met every limit; not reviewed yet.', className: 'border-pass/40 bg-pass-soft text-pass' },
  failing: { words: 'failing', hint: 'Its latest session failed a limit, or a session failed after the latest review.', className: 'border-fail/40 bg-fail-soft text-fail' },
  approved: { words: 'approved', hint: 'A reviewer signed it off.', className: 'border-pass bg-pass text-white' },
  rejected: { words: 'rejected', hint: 'A reviewer turned it down.', className: 'border-fail bg-fail text-white' },
};

/** "1.5 MiB", "812 bytes". */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n.toLocaleString('en-US')} bytes`;
  const units = ['KiB', 'MiB', 'GiB'];
  let v = n / 1024;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u++;
  }
  return `${v.toLocaleString('en-US', { maximumFractionDigits: 1 })} ${units[u]}`;
}

/** The first 12 hex digits: enough to tell bitstreams apart at a glance. */
export const shortSha = (sha: string) => sha.slice(0, 12);

/** "2026-03-01 09:00" in the reader's time zone. */
export function formatWhen(iso: string | null): string {
  if (!iso) return '—';
  const d = new Date(iso);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

export const formatMHz = (mhz: number) => `${mhz.toLocaleString('en-US', { maximumFractionDigits: 3 })} MHz`;

// A saved run's link figures (shared/link-engine/link-figures.ts) as labelled lines with units, for
// the session page. Stored JSON may be partial (older or seeded sessions) or hold figures this
// page does not know yet: a line is shown for what is there, and unknown entries are listed plainly.
import { NakReason } from '../../../../shared/link';

export interface FigureRow {
  label: string;
  value: string;
}

const NAK_WORDS: Record<number, string> = {
  [NakReason.BadCheck]: 'bad CHECK',
  [NakReason.BadLength]: 'bad length',
  [NakReason.UnknownKind]: 'unknown kind',
  [NakReason.Paused]: 'paused',
  [NakReason.QueueFull]: 'queue full',
  [NakReason.AngleOutOfRange]: 'angle out of range',
};

const int = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 0 });
const dec = (v: number, digits: number) => v.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
const plain = (v: unknown) => (v === null || v === undefined ? '—' : typeof v === 'object' ? JSON.stringify(v) : String(v));
const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** "3 (bad CHECK 2, paused 1)", "none", or the stored value as it is when it is not a count map. */
function nakText(naks: unknown): string {
  if (!naks || typeof naks !== 'object' || Array.isArray(naks)) return plain(naks);
  const entries = Object.entries(naks as Record<string, unknown>);
  if (!entries.every(([, n]) => isNum(n))) return plain(naks);
  const counted = (entries as [string, number][]).filter(([, n]) => n > 0);
  if (!counted.length) return 'none';
  const total = counted.reduce((a, [, n]) => a + n, 0);
  return `${int(total)} (${counted.map(([code, n]) => `${NAK_WORDS[Number(code)] ?? `reason ${code}`} ${int(n)}`).join(', ')})`;
}

type Format = (v: unknown) => string;
const num = (f: (v: number) => string): Format => (v) => (isNum(v) ? f(v) : plain(v));
const count = num(int);
const bytes = num((v) => `${int(v)} B`);

/** Lines in the order an engineer reads them; a pair shares a line ("out / in"). */
const LINES: { label: string; keys: string[]; format: Format }[] = [
  { label: 'Frames out / in', keys: ['framesSent', 'framesReceived'], format: count },
  { label: 'Bytes out / in', keys: ['bytesSent', 'bytesReceived'], format: bytes },
  { label: 'Frames with a bad CHECK', keys: ['checkFailures'], format: count },
  { label: 'Bytes skipped by the decoder', keys: ['skippedBytes'], format: bytes },
  { label: 'NAKs by reason', keys: ['naks'], format: nakText },
  { label: 'Retries', keys: ['retries'], format: count },
  { label: 'Duplicate results', keys: ['duplicates'], format: count },
  { label: 'Stray replies', keys: ['strayReplies'], format: count },
  { label: 'Confirmations / unconfirmed', keys: ['confirmations', 'unconfirmed'], format: count },
  { label: 'Results per second', keys: ['resultsPerS'], format: num((v) => `${dec(v, 1)} /s`) },
  { label: 'Line use (replies)', keys: ['lineShare'], format: num((v) => `${dec(v * 100, 1)} %`) },
];
const KNOWN = new Set(LINES.flatMap((l) => l.keys));

export function linkFigureRows(figures: Record<string, unknown>): FigureRow[] {
  const rows = LINES.filter((line) => line.keys.some((k) => k in figures)).map((line) => ({ label: line.label, value: line.keys.map((k) => line.format(figures[k])).join(' / ') }));
  for (const [k, v] of Object.entries(figures)) if (!KNOWN.has(k)) rows.push({ label: k, value: plain(v) });
  return rows;
}

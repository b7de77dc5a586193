// One traffic entry as terminal lines: hex and ASCII by direction, with time stamps, decoded
// frames and decoder events in between.
import { kindName } from '../../../../shared/link';
import type { TrafficEntry } from '../live/traffic-log';

export const C = { dim: '\x1b[90m', tx: '\x1b[33m', rx: '\x1b[36m', frame: '\x1b[32m', warn: '\x1b[31m', off: '\x1b[0m' };

const stamp = (atMs: number) => {
  const d = new Date(performance.timeOrigin + atMs);
  return `${d.toTimeString().slice(0, 8)}.${String(d.getMilliseconds()).padStart(3, '0')}`;
};
const hex = (b: number) => b.toString(16).padStart(2, '0');

/** The entry's lines; a chunk of bytes shows at most `maxRows` rows of 16, then says how much more it held. */
export function formatTraffic(e: TrafficEntry, maxRows = Infinity): string[] {
  const t = `${C.dim}${stamp(e.atMs)}${C.off}`;
  if (e.type === 'note') return [`${t} ${C.warn}! ${e.text}${C.off}`];
  if (e.type === 'skip') return [`${t} ${C.warn}! skipped ${e.event.bytes} B (${e.event.reason}) at ${e.event.offset}${C.off}`];
  if (e.type === 'frame') return [`${t} ${C.frame}  ⇐ ${kindName(e.frame.kind)} tag ${e.frame.tag}, ${e.frame.payload.length} B payload${C.off}`];
  const out: string[] = [];
  const col = e.direction === 'tx' ? C.tx : C.rx;
  const arrow = e.direction === 'tx' ? 'TX →' : 'RX ←';
  const shown = Math.min(e.bytes.length, Math.max(1, maxRows) * 16);
  for (let at = 0; at < shown; at += 16) {
    const row = e.bytes.subarray(at, at + 16);
    const h = Array.from(row, hex).join(' ').padEnd(47);
    const a = Array.from(row, (b) => (b >= 0x20 && b < 0x7f ? String.fromCharCode(b) : '.')).join('');
    out.push(`${at === 0 ? t : ' '.repeat(12)} ${col}${at === 0 ? arrow : '    '}${C.off} ${h}  ${C.dim}${a}${C.off}`);
  }
  if (shown < e.bytes.length) out.push(`${' '.repeat(12)} ${C.dim}     … ${(e.bytes.length - shown).toLocaleString('en-US')} more bytes of this chunk not shown${C.off}`);
  return out;
}

/** Copy text to the clipboard; where that is not allowed, download it as a file instead. */
export async function copyOrDownload(text: string, fileName: string): Promise<'copied' | 'downloaded'> {
  try {
    if (!navigator.clipboard?.writeText) throw new Error('no clipboard');
    await navigator.clipboard.writeText(text);
    return 'copied';
  } catch {
    const url = URL.createObjectURL(new Blob([text], { type: 'text/plain' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = fileName;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
    return 'downloaded';
  }
}

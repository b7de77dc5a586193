// A capture archive's records as terminal lines: time since the first record, direction, bytes
// in hex and ASCII, and each decoded frame summarised from its payload. ANSI colours as on the
// Bench page's traffic pane.
import { decodePayload, Kind, kindName, NakReason, SweepStatus, vectorWireProfile, type ArchiveRecord, type DecodedFrame, type Direction, type WireProfile } from '../../../../shared/link';

export const C = { dim: '\x1b[90m', tx: '\x1b[33m', rx: '\x1b[36m', frame: '\x1b[32m', warn: '\x1b[31m', off: '\x1b[0m' };

const hex = (b: number) => b.toString(16).padStart(2, '0');
const nameOf = (table: Record<string, number>, v: number) => Object.entries(table).find(([, n]) => n === v)?.[0] ?? `code ${v}`;

/** "+12.345 s" after the first record. */
export function stamp(timeMs: number, t0Ms: number): string {
  return `+${((timeMs - t0Ms) / 1000).toFixed(3).padStart(9)} s`;
}

/** One line saying what a frame carried. */
export function frameSummary(f: DecodedFrame, profile: WireProfile): string {
  const head = `${kindName(f.kind)} tag ${f.tag}`;
  let m;
  try {
    m = decodePayload(f.kind, f.payload, profile);
  } catch (err) {
    return `${head}: payload not readable (${(err as Error).message})`;
  }
  switch (m.kind) {
    case Kind.One:
      return `${head}: angle code ${m.angleCode}`;
    case Kind.List:
      return `${head}: ${m.angleCodes.length} angle codes from ${m.angleCodes[0] ?? '—'}`;
    case Kind.Sweep:
      return `${head}: ${m.count} codes from ${m.start}, step ${m.step}`;
    case Kind.Info:
      return `${head}: "${m.info.name}", ${m.info.angleFormat} ${m.info.angleBits}-bit angles, ${m.info.outBits}-bit outputs (${m.info.outFrac} fraction bits)`;
    case Kind.Results:
      return `${head}: ${m.cos.length} results from index ${m.firstIndex}`;
    case Kind.ModeInfo:
      return m.modes.vectoring
        ? `${head}: vectoring, ${m.modes.vectoring.inBits}-bit x/y, ${m.modes.vectoring.angleFormat} ${m.modes.vectoring.angleBits}-bit angles, ${m.modes.vectoring.magBits}-bit magnitudes`
        : `${head}: rotation only`;
    case Kind.VecOne:
      return `${head}: vector (${m.x}, ${m.y})`;
    case Kind.VecList:
      return `${head}: ${m.xs.length} vectors from (${m.xs[0] ?? '—'}, ${m.ys[0] ?? '—'})`;
    case Kind.VecGrid:
      return `${head}: ${m.nx} × ${m.ny} grid from (${m.x0}, ${m.y0}), steps ${m.dx}, ${m.dy}`;
    case Kind.VecResults:
      return `${head}: ${m.angle.length} vector results from index ${m.firstIndex}`;
    case Kind.SweepEnd:
      return `${head}: ${m.done} done, ${nameOf(SweepStatus, m.status).toLowerCase()}`;
    case Kind.Ack:
      return `${head}: acknowledges tag ${m.acked}`;
    case Kind.Nak:
      return `${head}: refuses tag ${m.refused}, ${nameOf(NakReason, m.reason)}`;
    default:
      return head;
  }
}

const arrow = (d: Direction) => (d === 'to-device' ? `${C.tx}TX →${C.off}` : `${C.rx}RX ←${C.off}`);

/** The lines of one record. `profile` is the wire profile in force for its direction. */
export function recordLines(r: ArchiveRecord, t0Ms: number, profile: WireProfile): string[] {
  const t = `${C.dim}${stamp(r.timeMs, t0Ms)}${C.off}`;
  switch (r.type) {
    case 'chunk': {
      const out: string[] = [];
      for (let at = 0; at < r.bytes.length; at += 16) {
        const row = r.bytes.subarray(at, at + 16);
        const h = Array.from(row, hex).join(' ').padEnd(47);
        const a = Array.from(row, (b) => (b >= 0x20 && b < 0x7f ? String.fromCharCode(b) : '.')).join('');
        out.push(`${at === 0 ? t : ' '.repeat(t.length - C.dim.length - C.off.length)} ${at === 0 ? arrow(r.direction) : '    '} ${h}  ${C.dim}${a}${C.off}`);
      }
      return out.length ? out : [`${t} ${arrow(r.direction)} (empty chunk)`];
    }
    case 'frame':
      return [`${t} ${C.frame}  ${r.direction === 'to-device' ? '⇒' : '⇐'} ${frameSummary(r.frame, profile)}${C.off}`];
    case 'skip':
      return [`${t} ${C.warn}! ${r.direction}: skipped ${r.event.bytes} B (${r.event.reason}) at offset ${r.event.offset}${C.off}`];
    case 'profile':
      return [`${t} ${C.dim}${r.direction}: profile now ${r.profile.angleFormat}, ${r.profile.angleBits}-bit angles, ${r.profile.outBits}-bit outputs${C.off}`];
    case 'vector-formats':
      return [`${t} ${C.dim}${r.direction}: vectoring formats now ${r.formats.inBits}-bit x/y, ${r.formats.angleFormat} ${r.formats.angleBits}-bit angles, ${r.formats.magBits}-bit magnitudes${C.off}`];
    case 'finish':
      return [`${t} ${C.dim}${r.direction}: end of stream${C.off}`];
  }
}

/** The wire profile in force for each record (profile records switch their direction's). */
export function profilesByRecord(records: readonly ArchiveRecord[], start: WireProfile): WireProfile[] {
  const now: Record<Direction, WireProfile> = { 'to-device': start, 'to-host': start };
  return records.map((r) => {
    if (r.type === 'profile') now[r.direction] = r.profile;
    else if (r.type === 'vector-formats') now[r.direction] = { ...now[r.direction], vector: vectorWireProfile(r.formats) };
    return now[r.direction];
  });
}

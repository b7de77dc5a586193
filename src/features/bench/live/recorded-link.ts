// Opening a bench link: a link engine whose every chunk, frame and skip goes both to the
// connection's capture and to the traffic pane. Kept apart from the controller, which only decides
// what the page shows about the connection.
import { LinkEngine, type EngineClock } from '../../../../shared/link-engine/link-engine';
import type { ByteLink, LinkCloseReason } from '../../../../shared/link-engine/byte-link';
import type { Crc8Name } from '../../../../shared/link/crc8';
import { ConnectionRecording } from './connection-recording';
import { LOSS_SILENCE_MS, sweepSegmentFor } from './link-settings';
import type { TrafficLog } from './traffic-log';

export interface RecordedLink {
  link: ByteLink;
  engine: LinkEngine;
  recording: ConnectionRecording;
}

export interface RecordedLinkOptions {
  label: string;
  baud: number;
  /** The frame check the board uses (default CRC-8/SMBUS, the protocol's). */
  crc?: Crc8Name;
  clock: EngineClock;
  traffic: TrafficLog;
  /** The link closed, after the capture was finished. */
  onClose: (link: ByteLink, reason: LinkCloseReason) => void;
}

/** Wires an opened link; the capture starts now, before HELLO, so it holds the whole exchange. */
export function recordedLink(link: ByteLink, o: RecordedLinkOptions): RecordedLink {
  const { clock, traffic } = o;
  const recording = new ConnectionRecording({ transport: o.label, baud: o.baud, openedAt: new Date().toISOString() }, o.crc);
  link.onWarning((m) => traffic.push({ type: 'note', text: m, atMs: clock.now() }));
  link.onClose((r) => {
    recording.finish(clock.now());
    o.onClose(link, r);
  });
  const engine = new LinkEngine({
    link,
    clock,
    baud: o.baud,
    crc: o.crc,
    timeoutMs: LOSS_SILENCE_MS,
    sweepSegment: sweepSegmentFor(o.baud),
    onTraffic: (direction, bytes, atMs) => {
      recording.traffic(direction, bytes, atMs);
      traffic.push({ type: 'bytes', direction, bytes: bytes.slice(), atMs });
    },
    onFrame: (frame, atMs) => {
      recording.frame(frame, atMs);
      traffic.push({ type: 'frame', frame, atMs });
    },
    onSkip: (event, atMs) => {
      recording.skip(event, atMs);
      traffic.push({ type: 'skip', event, atMs });
    },
  });
  return { link, engine, recording };
}

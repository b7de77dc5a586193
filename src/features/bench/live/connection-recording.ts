// The capture of one bench connection: every chunk each way with its time, the frames and decoder
// events of the host's own decoder, and the profile switch at INFO, from the moment the link opens
// until it closes. A run's archive is cut from it: the HELLO → INFO preamble, so it still says what
// device and profile it came from, then that run's own traffic only. It uses the engine's decoder events rather than a second decoder, so recording
// costs the page almost nothing; docs/archive.md has the byte layout.
import { profileFromInfo, Recorder, type Crc8Name, type DecodedFrame, type DeviceInfo, type ModeInfo, type SkipEvent } from '../../../../shared/link';
import type { RecorderMark } from '../../../../shared/link/recorder';

/** What the archive label says about where the capture came from (JSON). */
export interface BenchLabel {
  recordedBy: 'anglebench bench';
  transport: string;
  baud: number;
  openedAt: string;
}

export class ConnectionRecording {
  private readonly recorder: Recorder;
  private bytes = { 'to-device': 0, 'to-host': 0 };
  private finished = false;
  /** The end of the HELLO → INFO exchange (the start, until INFO is in). */
  private preambleEnd: RecorderMark;
  private runStart: RecorderMark | null = null;

  constructor(label: Omit<BenchLabel, 'recordedBy'>, crc?: Crc8Name) {
    this.recorder = new Recorder({ crc, accept: { 'to-device': 'requests', 'to-host': 'replies' }, label: JSON.stringify({ recordedBy: 'anglebench bench', ...label } satisfies BenchLabel) });
    this.preambleEnd = this.recorder.mark();
  }

  /** Bytes as they crossed the line ('tx': host to device). */
  traffic(direction: 'tx' | 'rx', bytes: Uint8Array, atMs: number) {
    if (this.finished) return;
    const d = direction === 'tx' ? 'to-device' : 'to-host';
    this.recorder.chunk(d, atMs, bytes);
    this.bytes[d] += bytes.length;
  }

  /** A frame the host decoded. */
  frame(f: DecodedFrame, atMs: number) {
    if (!this.finished) this.recorder.frame('to-host', atMs, f);
  }

  skip(e: SkipEvent, atMs: number) {
    if (!this.finished) this.recorder.skip('to-host', atMs, e);
  }

  /** INFO fixed the field sizes: both directions switch profile where their streams are now. */
  info(info: DeviceInfo, atMs: number) {
    if (this.finished) return;
    const p = profileFromInfo(info);
    this.recorder.profile('to-host', atMs, this.bytes['to-host'], p);
    this.recorder.profile('to-device', atMs, this.bytes['to-device'], p);
    this.preambleEnd = this.recorder.mark();
  }

  /** MODE_INFO of a vectoring board: its formats size VEC_* frames from here on, and the archive keeps them (so the preamble runs to here). */
  modes(modes: ModeInfo, atMs: number) {
    if (this.finished || !modes.vectoring) return;
    this.recorder.vectorFormats('to-host', atMs, this.bytes['to-host'], modes.vectoring);
    this.recorder.vectorFormats('to-device', atMs, this.bytes['to-device'], modes.vectoring);
    this.preambleEnd = this.recorder.mark();
  }

  /** Where the recording stands now (a soak's pass start, before its first request). */
  mark(): RecorderMark {
    return this.recorder.mark();
  }

  /**
   * A run starts here, before its first request: its archive leaves out what came before. A soak
   * moves it to its latest whole pass, so the saved capture stays about one pass long however
   * long the soak ran (and within the server's upload limit).
   */
  markRun(at: RecorderMark = this.recorder.mark()) {
    this.runStart = at;
  }

  /** The preamble and the latest run's traffic so far (the whole capture before any run). */
  runArchive(): Uint8Array {
    return this.runStart ? this.recorder.excerpt(this.preambleEnd, this.runStart) : this.recorder.toArchive();
  }

  /** The link closed: both streams end here. */
  finish(atMs: number) {
    if (this.finished) return;
    this.finished = true;
    this.recorder.finish('to-device', atMs);
    this.recorder.finish('to-host', atMs);
  }

  /** The whole connection's archive so far (recording may go on). */
  toArchive(): Uint8Array {
    return this.recorder.toArchive();
  }

  get byteLength() {
    return this.recorder.byteLength;
  }
}

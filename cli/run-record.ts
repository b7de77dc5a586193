// The run's capture: both directions through the shared Recorder, with a label that says what
// was asked (plan, model configuration), so an archive alone scores again to the same figures.
import { Kind, RecordedDecoder, Recorder, decodePayload, profileFromInfo, type Crc8Name } from '../shared/link';
import { samplesFromArchive } from '../shared/link-engine/archive-samples';
import { vectorSamplesFromArchive } from '../shared/link-engine/vector-archive-samples';
import { parseVectorConfig, planVectors, vectorPlanSchema } from '../shared/vectoring';
import { expandRequest } from '../shared/link-engine/run-request';
import { parseModelConfig, planSchema, type ModelConfig, type Plan } from '../shared/numeric';
import { planToRequest } from './run-plan';
import { scoreRun, type RunScore } from './run-score';
import { scoreVectorRun, type VectorRunLabel, type VectorRunScore } from './run-vector';

/** The archive label of a runner capture, as JSON. */
export interface RunLabel {
  recordedBy: 'anglebench run';
  core: string;
  build: string | null;
  board: string | null;
  plan: Plan;
  model: ModelConfig;
}

/** The label's size limit of the archive format (docs/archive.md), minus its other header fields. */
export const MAX_LABEL_BYTES = 65_000;

export function labelBytes(label: RunLabel): number {
  return new TextEncoder().encode(JSON.stringify(label)).length;
}

/**
 * Records every chunk each way; the to-host side switches profile at INFO, as the engine does.
 * The archive header (with its label) is written first, but the label is only known after INFO
 * has fixed the plan and model: until start(), chunks wait with their times.
 */
export class RunRecording {
  private readonly pending: Array<['tx' | 'rx', Uint8Array, number]> = [];
  private sides: { recorder: Recorder; toDevice: RecordedDecoder; toHost: RecordedDecoder } | null = null;
  private timeMs = 0;
  private finished = false;

  constructor(private readonly crc: Crc8Name) {}

  /** Bytes as they crossed the line, at the caller's time in ms. */
  traffic(direction: 'tx' | 'rx', bytes: Uint8Array, atMs: number) {
    if (this.finished) return;
    if (!this.sides) {
      this.pending.push([direction, bytes.slice(), atMs]);
      return;
    }
    this.timeMs = atMs;
    (direction === 'tx' ? this.sides.toDevice : this.sides.toHost).push(bytes);
  }

  /** Fix the label: write the header and everything recorded so far. */
  start(label: RunLabel | VectorRunLabel) {
    if (this.sides) return;
    const recorder = new Recorder({ crc: this.crc, accept: { 'to-device': 'requests', 'to-host': 'replies' }, label: JSON.stringify(label) });
    const nowMs = () => this.timeMs;
    const toDevice = new RecordedDecoder({ recorder, direction: 'to-device', nowMs, onFrame: () => {} });
    const toHost: RecordedDecoder = new RecordedDecoder({
      recorder,
      direction: 'to-host',
      nowMs,
      onFrame: (f) => {
        if (f.kind !== Kind.Info && f.kind !== Kind.ModeInfo) return;
        try {
          const m = decodePayload(f.kind, f.payload, toHost.decoder.profile);
          if (m.kind === Kind.Info) {
            const p = profileFromInfo(m.info);
            toHost.setProfile(p);
            toDevice.setProfile(p);
          } else if (m.kind === Kind.ModeInfo && m.modes.vectoring) {
            // MODE_INFO's formats size the VEC_* frames from here on, as the engine's; the archive
            // keeps them (a VECTOR_FORMATS record, docs/archive.md), so a replay sizes them the same.
            toHost.setVectorFormats(m.modes.vectoring);
            toDevice.setVectorFormats(m.modes.vectoring);
          }
        } catch {
          // An INFO the engine cannot use either: the run fails on its own.
        }
      },
    });
    this.sides = { recorder, toDevice, toHost };
    for (const [d, b, t] of this.pending.splice(0)) this.traffic(d, b, t);
  }

  /** Close both streams (incomplete frames become truncated skips) and return the archive. */
  finish(atMs: number): Uint8Array {
    if (!this.sides) throw new Error('RunRecording.finish before start');
    if (!this.finished) {
      this.timeMs = atMs;
      this.finished = true;
      this.sides.toDevice.finish();
      this.sides.toHost.finish();
    }
    return this.sides.recorder.toArchive();
  }
}

export class NotARunArchiveError extends Error {}

/**
 * Score an archive written by `run --out` again: requests are matched to replies by TAG as the
 * engine matches them, and the first answer of each code fills the plan's slots in order.
 */
export function scoreArchive(bytes: Uint8Array): { label: RunLabel; score: RunScore } {
  // The answers in request order (one read of the archive), then the label's plan to place them.
  const found = samplesFromArchive(bytes);
  let label: RunLabel;
  let vectoring = false;
  try {
    const raw = JSON.parse(found.label) as RunLabel | VectorRunLabel;
    if (raw.recordedBy !== 'anglebench run') throw new Error('not a runner label');
    if ('mode' in raw && raw.mode === 'vectoring') {
      vectoring = true;
      throw new Error('a vectoring label');
    }
    label = { ...raw, plan: planSchema.parse(raw.plan), model: parseModelConfig(raw.model) };
  } catch {
    if (vectoring) throw new NotARunArchiveError('This archive holds a vectoring run: score it with scoreVectorArchive');
    throw new NotARunArchiveError('This archive was not written by `run --out`: its label holds no plan');
  }
  // Each code's answers handed out to the plan's slots in turn.
  const answers = new Map<number, Array<[number, number]>>();
  for (let i = 0; i < found.codes.length; i++) {
    const list = answers.get(found.codes[i]) ?? [];
    list.push([found.cos[i], found.sin[i]]);
    answers.set(found.codes[i], list);
  }
  const profile = found.profile;
  const codes = expandRequest(planToRequest(label.plan, label.model), profile);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  const answered = new Uint8Array(codes.length);
  const used = new Map<number, number>();
  for (let i = 0; i < codes.length; i++) {
    const list = answers.get(codes[i]);
    const u = used.get(codes[i]) ?? 0;
    if (!list || u >= list.length) continue;
    [cos[i], sin[i]] = list[u];
    used.set(codes[i], u + 1);
    answered[i] = 1;
  }
  return { label, score: scoreRun(label.model, label.plan, { codes, cos, sin, answered }, found.checkFailures) };
}

/**
 * Score a vectoring capture written by `run --out` again, from the archive alone: its label's plan
 * and model, its VEC_* frames read at the formats its VECTOR_FORMATS records keep (archive version
 * 2), each vector's answers handed out to the plan's slots in turn.
 */
export function scoreVectorArchive(bytes: Uint8Array): { label: VectorRunLabel; score: VectorRunScore } {
  const found = vectorSamplesFromArchive(bytes);
  let label: VectorRunLabel;
  try {
    const raw = JSON.parse(found.label) as VectorRunLabel;
    if (raw.recordedBy !== 'anglebench run' || raw.mode !== 'vectoring') throw new Error('not a vectoring runner label');
    label = { ...raw, plan: vectorPlanSchema.parse(raw.plan), model: parseVectorConfig(raw.model) };
  } catch {
    throw new NotARunArchiveError('This archive was not written by `run --out` against a vectoring core: its label holds no vectoring plan');
  }
  const key = (x: number, y: number) => x * 2 ** 32 + y;
  const answers = new Map<number, Array<[number, number]>>();
  for (let i = 0; i < found.xs.length; i++) {
    const k = key(found.xs[i], found.ys[i]);
    answers.set(k, [...(answers.get(k) ?? []), [found.angles[i], found.magnitudes[i]]]);
  }
  const { xs, ys } = planVectors(label.plan, label.model);
  const angle = new Int32Array(xs.length);
  const magnitude = new Int32Array(xs.length);
  const answered = new Uint8Array(xs.length);
  const used = new Map<number, number>();
  for (let i = 0; i < xs.length; i++) {
    const k = key(xs[i], ys[i]);
    const list = answers.get(k);
    const u = used.get(k) ?? 0;
    if (!list || u >= list.length) continue;
    [angle[i], magnitude[i]] = list[u];
    used.set(k, u + 1);
    answered[i] = 1;
  }
  return { label, score: scoreVectorRun(label.model, { xs, ys, angle, magnitude, answered }, found.checkFailures) };
}

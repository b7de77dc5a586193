// Scoring an upload's samples while its body is still arriving. The runner and the Bench page send
// the `session` part before the samples, so the core is known when the first sample bytes land:
// each whole batch is scored as soon as it is in, the scoring overlapping the transfer, and
// storeSession finishes the score instead of starting it. A hint only: when anything is not as
// expected (no session part yet, an unknown or vectoring core, a model error, the core edited
// meanwhile) it is dropped and the samples are scored from the start, as without it.
import type { Request } from 'express';
import { Core } from '../db/models';
import { modeOf, rotationConfigOf } from './core-mode';
import { PackedScoring } from './session-scoring';

interface Started {
  coreId: number;
  /** The model configuration scored against, as JSON: a core edited meanwhile is not scored with the old one. */
  config: string;
  scoring: PackedScoring;
}

export class UploadScoring {
  private started: Started | null = null;
  private dropped = false;
  private bytes: Uint8Array = new Uint8Array(0);
  private size = 0;

  private constructor(sessionPart: unknown) {
    const target = coreOf(sessionPart);
    if (!target) {
      this.dropped = true;
      return;
    }
    const found = target.id !== undefined ? Core.findByPk(target.id) : Core.findOne({ where: { slug: target.slug } });
    found.then(
      (core) => this.start(core),
      () => (this.dropped = true),
    );
  }

  /** The scoring of `req`'s samples, begun on the first call (multer has read the parts before them into `req.body`). */
  static of(req: Request): UploadScoring {
    let scoring = ofRequest.get(req);
    if (!scoring) {
      scoring = new UploadScoring((req.body as Record<string, unknown> | undefined)?.session);
      ofRequest.set(req, scoring);
    }
    return scoring;
  }

  /** The first `size` bytes of `bytes` are in: score the whole batches among them. */
  progress(bytes: Uint8Array, size: number): void {
    this.bytes = bytes;
    this.size = size;
    this.feed();
  }

  /** The scoring begun for `core`, to be finished with every byte; null when there is none to finish. */
  take(core: Core): PackedScoring | null {
    const started = this.started;
    this.started = null;
    this.dropped = true;
    if (!started || started.coreId !== core.id || modeOf(core) !== 'rotation' || JSON.stringify(core.modelConfig) !== started.config) return null;
    return started.scoring;
  }

  private start(core: Core | null): void {
    if (this.dropped || !core || modeOf(core) !== 'rotation' || !core.modelConfig) {
      this.dropped = true;
      return;
    }
    const config = rotationConfigOf(core);
    this.started = { coreId: core.id, config: JSON.stringify(core.modelConfig), scoring: new PackedScoring(config, config.angleFormat) };
    this.feed();
  }

  private feed(): void {
    if (!this.started) return;
    try {
      this.started.scoring.feed(this.bytes, this.size);
    } catch {
      // The samples will be scored from the start at the end, and the error answered then.
      this.started = null;
      this.dropped = true;
    }
  }
}

const ofRequest = new WeakMap<Request, UploadScoring>();

/** The core a `session` part names, read leniently: the part is checked properly once the body is in. */
function coreOf(sessionPart: unknown): { id?: number; slug?: string } | null {
  if (typeof sessionPart !== 'string') return null;
  try {
    const value = JSON.parse(sessionPart) as { coreId?: unknown; coreSlug?: unknown } | null;
    if (Number.isSafeInteger(value?.coreId)) return { id: value!.coreId as number };
    if (typeof value?.coreSlug === 'string' && value.coreSlug) return { slug: value.coreSlug };
    return null;
  } catch {
    return null;
  }
}

// The latest run's results as kept in the browser until they are saved or discarded: plain,
// structured-clone-safe data. The codes are not kept: the plan and model make them again.
import type { RunProgress } from '../../../../shared/link-engine/link-figures';
import { restoredBookkeeping, type RecordBookkeeping, type RunContext } from './run-record';
import { parseModelConfig, planCodes, planSchema, type ModelConfig, type Plan } from '../../../../shared/numeric';
import { parseSoakRecord, type SoakRecord } from '../../../../shared/soak';

export const UNSAVED_RUN_VERSION = 1;

export interface RunOutcome {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  elapsedMs: number;
  missing: number;
}

/** Every answered result of a run, in request order, with what is needed to save it. */
export interface RunRecord extends RunContext, RecordBookkeeping {
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  plan: Plan;
  config: ModelConfig;
  /** A soak's books (the answers above are then its last whole pass); null for a single run. */
  soak: SoakRecord | null;
}

/** A RunRecord as IndexedDB keeps it: without the codes, dates as ISO text. */
export interface StoredRun extends Omit<RunRecord, 'codes' | 'startedAt' | 'endedAt'> {
  version: typeof UNSAVED_RUN_VERSION;
  /** When it was put away, ms since 1970. */
  storedAt: number;
  startedAt: string;
  endedAt: string | null;
}

export function toStoredRun(r: RunRecord, storedAt: number): StoredRun {
  const { codes: _codes, ...rest } = r;
  return { ...rest, version: UNSAVED_RUN_VERSION, storedAt, startedAt: r.startedAt.toISOString(), endedAt: r.endedAt?.toISOString() ?? null };
}

export class StoredRunError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StoredRunError';
  }
}

/**
 * A stored run back as a record, checked: a different version, a plan or model that no longer
 * parses, or arrays that do not match the plan's length are refused with the reason.
 */
export function fromStoredRun(raw: unknown): RunRecord {
  const s = raw as Partial<StoredRun> | null;
  if (!s || typeof s !== 'object') throw new StoredRunError('nothing stored');
  if (s.version !== UNSAVED_RUN_VERSION) throw new StoredRunError(`stored by another version of the page (${String(s.version)})`);
  const plan = planSchema.safeParse(s.plan);
  if (!plan.success) throw new StoredRunError('its plan no longer reads');
  let config: ModelConfig;
  let codes: Float64Array;
  try {
    config = parseModelConfig(s.config);
    codes = planCodes(plan.data, config);
  } catch (e) {
    throw new StoredRunError(`its plan or core profile no longer reads: ${(e as Error).message}`);
  }
  const n = codes.length;
  if (!(s.cos instanceof Int32Array) || !(s.sin instanceof Int32Array) || !(s.answered instanceof Uint8Array)) throw new StoredRunError('its results are not typed arrays');
  if (s.cos.length !== n || s.sin.length !== n || s.answered.length !== n) throw new StoredRunError(`its results hold ${s.cos.length} entries for a plan of ${n}`);
  const kept = restoredBookkeeping(s);
  let soak: SoakRecord | null = null;
  try {
    // Absent in runs stored before soaks were kept.
    soak = s.soak == null ? null : parseSoakRecord(s.soak);
  } catch {
    throw new StoredRunError('its soak books no longer read');
  }
  return {
    codes,
    cos: s.cos,
    sin: s.sin,
    answered: s.answered,
    plan: plan.data,
    config,
    ...kept,
    soak,
  };
}

/** Where a restored run ended, as the progress bar shows it. */
export function restoredProgress(r: RunRecord): RunProgress {
  let answered = 0;
  for (let i = 0; i < r.answered.length; i++) answered += r.answered[i] ? 1 : 0;
  const missing = r.outcome?.missing ?? r.codes.length - answered;
  return { done: answered + missing, answered, missing, total: r.codes.length, ratePerS: r.figures?.resultsPerS ?? 0, etaS: null, elapsedMs: r.outcome?.elapsedMs ?? 0, paused: false };
}

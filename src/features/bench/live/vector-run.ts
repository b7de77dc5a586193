// A vectoring run as a plan asks for it: the request the link engine sends, and the record its
// answers fill in, in request order. Grids (and exhaustive plans, a grid of stride 1) go out as
// VEC_GRID segments the board expands itself; every other plan as its (x, y) pairs.
import { expandVectorRequest, type VectorRunRequest } from '../../../../shared/link-engine/run-request';
import { vectorPlanRequest } from '../../../../shared/link-engine/vector-plan-request';
import type { WireProfile } from '../../../../shared/link/wire-profile';
import type { ModeInfo } from '../../../../shared/link';
import { bindVectorPlan, parseVectorConfig, vectorPlanSchema, type VectorConfig, type VectorPlan } from '../../../../shared/vectoring';
import { openRecord, restoredBookkeeping, VECTOR_COLUMNS, type RecordBookkeeping, type RunContext } from './run-record';
import { StoredRunError, UNSAVED_RUN_VERSION } from './unsaved-run';

/** Every answered pair of a vectoring run, in request order, with what is needed to save it. */
export interface VectorRunRecord extends RunContext, RecordBookkeeping {
  mode: 'vectoring';
  xs: Int32Array;
  ys: Int32Array;
  angle: Int32Array;
  magnitude: Int32Array;
  plan: VectorPlan;
  config: VectorConfig;
  modes: ModeInfo | null;
}

/** @throws PlanError for a plan the input format cannot take, RangeError for one the link cannot carry. */
export function newVectorRun(plan: VectorPlan, config: VectorConfig, profile: WireProfile, at: RunContext & { modes: ModeInfo | null }): { request: VectorRunRequest; record: VectorRunRecord } {
  const request = vectorPlanRequest(bindVectorPlan(plan, config), config);
  const { xs, ys } = request.kind === 'grid' ? expandVectorRequest(request, profile) : request;
  const record: VectorRunRecord = openRecord(VECTOR_COLUMNS, xs.length, { mode: 'vectoring' as const, xs, ys, plan, config, ...at });
  return { request, record };
}

/** A vectoring record as IndexedDB keeps it (its inputs too: a grid's order is the board's). */
export interface StoredVectorRun extends Omit<VectorRunRecord, 'startedAt' | 'endedAt'> {
  version: typeof UNSAVED_RUN_VERSION;
  storedAt: number;
  startedAt: string;
  endedAt: string | null;
}

export function toStoredVectorRun(r: VectorRunRecord, storedAt: number): StoredVectorRun {
  return { ...r, version: UNSAVED_RUN_VERSION, storedAt, startedAt: r.startedAt.toISOString(), endedAt: r.endedAt?.toISOString() ?? null };
}

/** True for what toStoredVectorRun stored (rotation runs carry no `mode`). */
export const isStoredVectorRun = (raw: unknown): boolean => !!raw && typeof raw === 'object' && (raw as { mode?: unknown }).mode === 'vectoring';

/** A stored vectoring run back as a record, checked like fromStoredRun. */
export function fromStoredVectorRun(raw: unknown): VectorRunRecord {
  const s = raw as Partial<StoredVectorRun>;
  if (s.version !== UNSAVED_RUN_VERSION) throw new StoredRunError(`stored by another version of the page (${String(s.version)})`);
  const plan = vectorPlanSchema.safeParse(s.plan);
  if (!plan.success) throw new StoredRunError('its plan no longer reads');
  let config: VectorConfig;
  try {
    config = parseVectorConfig(s.config);
  } catch (e) {
    throw new StoredRunError(`its core profile no longer reads: ${(e as Error).message}`);
  }
  const cols = [s.xs, s.ys, s.angle, s.magnitude];
  if (!cols.every((c) => c instanceof Int32Array) || !(s.answered instanceof Uint8Array)) throw new StoredRunError('its results are not typed arrays');
  const n = s.answered.length;
  if (cols.some((c) => c!.length !== n)) throw new StoredRunError('its inputs and answers differ in length');
  const kept = restoredBookkeeping(s);
  return {
    mode: 'vectoring',
    xs: s.xs!,
    ys: s.ys!,
    angle: s.angle!,
    magnitude: s.magnitude!,
    answered: s.answered,
    plan: plan.data,
    config,
    ...kept,
    modes: s.modes ?? null,
  };
}

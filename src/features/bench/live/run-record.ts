// What a rotation run's record and a vectoring run's share: answer columns named as the link
// engine's result batches name them, which indexes were answered, and where and when the run
// happened. newRun and newVectorRun open their records here; the controller fills them here.
import type { LinkFigures } from '../../../../shared/link-engine/link-figures';
import type { DeviceInfo } from '../../../../shared/link';
import { StoredRunError, type RunOutcome } from './unsaved-run';

/** Where the run happens, as the record keeps it. */
export interface RunContext {
  transportLabel: string | null;
  baud: number;
  info: DeviceInfo | null;
}

/** The answer columns of each kind of run (the result batches' field names). */
export const ROTATION_COLUMNS = ['cos', 'sin'] as const;
export const VECTOR_COLUMNS = ['angle', 'magnitude'] as const;

/** What every record holds beside its inputs, answers and context. */
export interface RecordBookkeeping {
  /** 1 where the board answered that index. */
  answered: Uint8Array;
  startedAt: Date;
  endedAt: Date | null;
  /** The run's capture: the connection's HELLO → INFO preamble, then the run's own traffic. */
  archive: Uint8Array | null;
  outcome: RunOutcome | null;
  figures: LinkFigures | null;
}

type Answers<C extends string> = Record<C, Int32Array> & { answered: Uint8Array };

/** A record of `n` unanswered results in the columns named, begun now, with `fields` (inputs, plan, context). */
export function openRecord<C extends string, F extends object>(columns: readonly C[], n: number, fields: F): F & Record<C, Int32Array> & RecordBookkeeping {
  const answers = Object.fromEntries(columns.map((c) => [c, new Int32Array(n)])) as Record<C, Int32Array>;
  return { ...fields, ...answers, answered: new Uint8Array(n), startedAt: new Date(), endedAt: null, archive: null, outcome: null, figures: null };
}

/** One batch of answers into the record's columns. */
export function takeAnswers<C extends string>(record: Answers<C>, columns: readonly C[], b: { indexes: Uint32Array } & Record<C, Int32Array>) {
  const { indexes } = b;
  for (const c of columns) {
    const to = record[c];
    const from = b[c];
    for (let k = 0; k < indexes.length; k++) to[indexes[k]] = from[k];
  }
  for (let k = 0; k < indexes.length; k++) record.answered[indexes[k]] = 1;
}

/** Empty the answers for a soak's next pass (the arrays are reused: a soak's memory stays put). */
export function clearAnswers<C extends string>(record: Answers<C>, columns: readonly C[]) {
  for (const c of columns) record[c].fill(0);
  record.answered.fill(0);
}

/** A stored record's context and bookkeeping as IndexedDB kept them: dates as ISO text, any of them perhaps absent. */
type StoredBookkeeping = Partial<RunContext & Omit<RecordBookkeeping, 'answered' | 'startedAt' | 'endedAt'> & { startedAt: string; endedAt: string | null }>;

/** The context and bookkeeping of a stored record back as a record keeps them. @throws StoredRunError for a capture that is not bytes */
export function restoredBookkeeping(s: StoredBookkeeping): RunContext & Omit<RecordBookkeeping, 'answered'> {
  if (s.archive != null && !(s.archive instanceof Uint8Array)) throw new StoredRunError('its capture is not bytes');
  return {
    startedAt: new Date(s.startedAt ?? 0),
    endedAt: s.endedAt ? new Date(s.endedAt) : null,
    transportLabel: s.transportLabel ?? null,
    baud: s.baud ?? 0,
    info: s.info ?? null,
    archive: s.archive ?? null,
    outcome: s.outcome ?? null,
    figures: s.figures ?? null,
  };
}

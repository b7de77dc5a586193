import { useMutation, useQueryClient } from '@tanstack/react-query';
import { postSession, sessionKeys, type SessionStoredReply } from '../../../lib/resources/sessions';
import type { RunRecord, VectorRunRecord } from '../live/bench-controller';
import { packSamples } from '../../../../shared/link-engine/sample-pack';
import { packVectorSamples } from '../../../../shared/link-engine/vector-sample-pack';
import type { Conditions } from '../../../../shared/soak';

export type { LimitOutcome } from '../../../lib/resources/sessions';
/** The server's reply: it scores the samples itself and judges them against the core's limits. */
export type SavedSession = SessionStoredReply;

export interface SaveSessionInput {
  record: RunRecord | VectorRunRecord;
  coreId: number;
  buildId: number | null;
  boardId: number | null;
  notes: string;
  tags: string[];
  /** Operating conditions from the save form; left out when none were given. */
  conditions?: Conditions;
  /** Link figures of the run, when known (check failures count towards the verdict). */
  link?: Record<string, unknown> | null;
  /** A capture archive, when the page recorded one. */
  archive?: Blob | null;
}

export function saveSession(input: SaveSessionInput): Promise<SavedSession> {
  const { record } = input;
  const session = {
    coreId: input.coreId,
    buildId: input.buildId,
    boardId: input.boardId,
    startedAt: record.startedAt.toISOString(),
    endedAt: record.endedAt?.toISOString() ?? null,
    plan: { ...record.plan },
    transport: { label: record.transportLabel, baud: record.baud, source: 'bench' },
    deviceInfo: record.info ? { ...record.info, ...('mode' in record && record.modes ? { modes: record.modes } : {}) } : null,
    notes: input.notes,
    tags: input.tags,
    ...(input.conditions && Object.keys(input.conditions).length > 0 ? { conditions: input.conditions } : {}),
    // A soak's books, as the runner uploads them; the samples are its last whole pass.
    ...(!('mode' in record) && record.soak ? { soak: record.soak } : {}),
    ...(input.link ? { link: input.link } : {}),
  };
  const form = new FormData();
  form.set('session', JSON.stringify(session));
  // A vectoring run's answers go as 16-byte records (x, y, angle, magnitude), a rotation run's as its own format.
  const samples =
    'mode' in record
      ? packVectorSamples({ xs: record.xs, ys: record.ys, angles: record.angle, magnitudes: record.magnitude }, record.answered)
      : packSamples(record.codes, record.cos, record.sin, record.answered);
  form.set('samples', new Blob([samples], { type: 'application/octet-stream' }), 'samples.bin');
  if (input.archive) form.set('archive', input.archive, 'capture.abrc');
  return postSession(form);
}

export function useSaveSession() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: saveSession,
    onSuccess: () => qc.invalidateQueries({ queryKey: sessionKeys.all }),
  });
}

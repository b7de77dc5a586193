// Runs one stored-session scoring in its own worker; aborting ends the worker.
import type { ModelConfigInput } from '../../../../shared/numeric';
import type { VectorConfig } from '../../../../shared/vectoring';
import type { StoredScoreReply, StoredScoreRequest } from './stored-score-protocol';
import type { VectorStoredScoreReply, VectorStoredScoreRequest } from './vector-stored-score-protocol';

export type StoredScore = Extract<StoredScoreReply, { type: 'done' }>;
export type VectorStoredScore = Extract<VectorStoredScoreReply, { type: 'done' }>;

type Reply<T> = { type: 'progress'; done: number; total: number } | { type: 'error'; message: string } | T;

/** One request to a fresh worker; progress reported, the 'done' reply resolved, an error refused. */
function scoreInWorker<T extends { type: 'done' }>(w: Worker, request: unknown, bytes: ArrayBuffer, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<T> {
  return new Promise((resolve, reject) => {
    const end = () => {
      w.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = () => {
      end();
      reject(signal!.reason ?? new DOMException('Aborted', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbort);
    w.onmessage = (e: MessageEvent<Reply<T>>) => {
      const m = e.data;
      if (m.type === 'progress') return onProgress(m.done, m.total);
      end();
      if (m.type === 'error') reject(new Error(`The samples could not be scored: ${m.message}`));
      else resolve(m);
    };
    w.onerror = (e) => {
      end();
      reject(new Error(`The scoring worker failed: ${e.message}`));
    };
    w.postMessage(request, [bytes]);
  });
}

export function runStoredScore(bytes: ArrayBuffer, config: ModelConfigInput, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<StoredScore> {
  const w = new Worker(new URL('./stored-score.worker.ts', import.meta.url), { type: 'module' });
  return scoreInWorker<StoredScore>(w, { bytes, config } satisfies StoredScoreRequest, bytes, onProgress, signal);
}

/** A vectoring session's samples (16-byte records) under the core's vectoring configuration. */
export function runVectorStoredScore(bytes: ArrayBuffer, config: VectorConfig, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<VectorStoredScore> {
  const w = new Worker(new URL('./vector-stored-score.worker.ts', import.meta.url), { type: 'module' });
  return scoreInWorker<VectorStoredScore>(w, { bytes, config } satisfies VectorStoredScoreRequest, bytes, onProgress, signal);
}

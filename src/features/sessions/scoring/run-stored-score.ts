// Runs one stored-session scoring in its own worker; aborting ends the worker.
import type { ModelConfigInput } from '../../../../shared/numeric';
import type { StoredScoreReply, StoredScoreRequest } from './stored-score-protocol';

export type StoredScore = Extract<StoredScoreReply, { type: 'done' }>;

export function runStoredScore(bytes: ArrayBuffer, config: ModelConfigInput, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<StoredScore> {
  return new Promise((resolve, reject) => {
    const w = new Worker(new URL('./stored-score.worker.ts', import.meta.url), { type: 'module' });
    const end = () => {
      w.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = () => {
      end();
      reject(signal!.reason ?? new DOMException('Aborted', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbort);
    w.onmessage = (e: MessageEvent<StoredScoreReply>) => {
      const m = e.data;
      if (m.type === 'progress') return onProgress(m.done, m.total);
      end();
      if (m.type === 'done') resolve(m);
      else reject(new Error(`The samples could not be scored: ${m.message}`));
    };
    w.onerror = (e) => {
      end();
      reject(new Error(`The scoring worker failed: ${e.message}`));
    };
    w.postMessage({ bytes, config } satisfies StoredScoreRequest, [bytes]);
  });
}

// Runs one explanation in a worker. A worker that finished is kept for the next run on this page,
// so a second search starts with the search code already compiled; aborting (the Cancel button)
// or a failure ends the worker at once.
import type { HypothesisRef } from '../../../../shared/explain';
import type { ModelConfig } from '../../../../shared/numeric';
import type { ExplainReply, ExplainRequest } from './explain-protocol';

export type ExplainResult = Extract<ExplainReply, { type: 'done' }>;

let kept: Worker | null = null;

export function runExplain(bytes: ArrayBuffer, declared: ModelConfig, hypothesis: HypothesisRef | null, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<ExplainResult> {
  return new Promise((resolve, reject) => {
    if (signal?.aborted) return reject(signal.reason ?? new DOMException('Aborted', 'AbortError'));
    const w = kept ?? new Worker(new URL('./explain.worker.ts', import.meta.url), { type: 'module' });
    kept = null;
    const detach = () => {
      signal?.removeEventListener('abort', onAbort);
      w.onmessage = null;
      w.onerror = null;
    };
    const end = () => {
      detach();
      w.terminate();
    };
    const onAbort = () => {
      end();
      reject(signal!.reason ?? new DOMException('Aborted', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbort);
    w.onmessage = (e: MessageEvent<ExplainReply>) => {
      const m = e.data;
      if (m.type === 'progress') return onProgress(m.done, m.total);
      if (m.type === 'done') {
        detach();
        // One spare worker at most; another run finishing meanwhile ends its own.
        if (kept) w.terminate();
        else kept = w;
        resolve(m);
      } else {
        end();
        reject(new Error(`The answers could not be explained: ${m.message}`));
      }
    };
    w.onerror = (e) => {
      end();
      reject(new Error(`The explanation worker failed: ${e.message}`));
    };
    w.postMessage({ bytes, declared, hypothesis } satisfies ExplainRequest, [bytes]);
  });
}

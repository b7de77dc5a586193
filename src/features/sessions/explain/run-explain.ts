// Runs one explanation in its own worker; aborting (the Cancel button) ends the worker at once.
import type { HypothesisRef } from '../../../../shared/explain';
import type { ModelConfig } from '../../../../shared/numeric';
import type { ExplainReply, ExplainRequest } from './explain-protocol';

export type ExplainResult = Extract<ExplainReply, { type: 'done' }>;

export function runExplain(bytes: ArrayBuffer, declared: ModelConfig, hypothesis: HypothesisRef | null, onProgress: (done: number, total: number) => void, signal?: AbortSignal): Promise<ExplainResult> {
  return new Promise((resolve, reject) => {
    if (signal?.aborted) return reject(signal.reason ?? new DOMException('Aborted', 'AbortError'));
    const w = new Worker(new URL('./explain.worker.ts', import.meta.url), { type: 'module' });
    const end = () => {
      w.terminate();
      signal?.removeEventListener('abort', onAbort);
    };
    const onAbort = () => {
      end();
      reject(signal!.reason ?? new DOMException('Aborted', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbort);
    w.onmessage = (e: MessageEvent<ExplainReply>) => {
      const m = e.data;
      if (m.type === 'progress') return onProgress(m.done, m.total);
      end();
      if (m.type === 'done') resolve(m);
      else reject(new Error(`The answers could not be explained: ${m.message}`));
    };
    w.onerror = (e) => {
      end();
      reject(new Error(`The explanation worker failed: ${e.message}`));
    };
    w.postMessage({ bytes, declared, hypothesis } satisfies ExplainRequest, [bytes]);
  });
}

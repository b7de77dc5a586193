/// <reference lib="webworker" />
// Explains a stored session off the main thread: unpack, search with the shared explain() (or take
// the hypothesis given), and reduce board − hypothesis and board − declared to chart data. The
// page cancels by ending the worker.
import { createFaultyModel, explain } from '../../../../shared/explain';
import { unpackSamples } from '../../../../shared/link-engine/sample-pack';
import { parseModelConfig } from '../../../../shared/numeric';
import { diffCurves } from './diff-curves';
import type { ExplainReply, ExplainRequest } from './explain-protocol';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const post = (m: ExplainReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);
/** Progress at most this often: the search reports far more often than a bar can show. */
const PROGRESS_EVERY_MS = 100;

scope.onmessage = (e: MessageEvent<ExplainRequest>) => {
  try {
    const t0 = performance.now();
    const declared = parseModelConfig(e.data.declared);
    const s = unpackSamples(new Uint8Array(e.data.bytes), declared.angleFormat);
    let last = 0;
    const explanation = e.data.hypothesis
      ? null
      : explain(
          declared,
          { angle: s.codes, cos: s.cos, sin: s.sin },
          {
            onProgress(done, total) {
              const now = performance.now();
              if (now - last < PROGRESS_EVERY_MS && done < total) return;
              last = now;
              post({ type: 'progress', done, total });
            },
          },
        );
    const elapsedMs = performance.now() - t0;
    const best = e.data.hypothesis ?? explanation!.hypotheses[0] ?? { config: declared, fault: null };
    const curves = diffCurves(declared, s, createFaultyModel(best.config, best.fault), createFaultyModel(declared, null));
    const transfer = [...curves.hypothesis, ...curves.declared].map((c) => (c as Float64Array).buffer);
    post({ type: 'done', explanation, curves, elapsedMs }, [...new Set(transfer)]);
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};

// The Explain panel: for a session whose answers differ from the declared model, search (in a
// worker, cancellable) for the configuration or defect that reproduces them, show the ranked
// hypotheses, board − hypothesis beside board − declared, one code traced through both, and save
// the server's own search with the session. A healthy session says its core matches its model.
import { useEffect, useRef, useState } from 'react';
import type { HypothesisRef } from '../../../../shared/explain';
import { traceFaulty } from '../../../../shared/explain';
import { parseModelConfig, type CordicTrace, type ModelConfig } from '../../../../shared/numeric';
import { ExplanationSummary } from '../../../components/explanation-summary';
import { btn, btnPrimary, input, panel, panelTitle } from '../../../components/ui';
import { useExplanation } from '../../../lib/resources/explanations';
import type { CoreRecord } from '../../../lib/resources/cores';
import { fetchBytes } from '../api/fetch-bytes';
import { useSaveExplanation } from '../api/save-explanation';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { DiffChart } from './diff-chart';
import { SavedExplanation } from './saved-explanation';
import { runExplain, type ExplainResult } from './run-explain';
import { TraceTable } from './trace-table';

type Phase =
  | { kind: 'idle' }
  | { kind: 'running'; done: number; total: number; search: boolean }
  | { kind: 'done'; result: ExplainResult; best: HypothesisRef; search: boolean; run: number }
  | { kind: 'cancelled' }
  | { kind: 'error'; message: string };

const count = (n: number) => n.toLocaleString('en-US');

export function ExplainPanel({ session, core, canEdit }: { session: SessionRecord; core: CoreRecord | undefined; canEdit: boolean }) {
  const mismatches = session.stats.mismatches?.count ?? null;
  const stored = useExplanation(session.id);
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const abort = useRef<AbortController | null>(null);
  const runs = useRef(0);
  useEffect(() => () => abort.current?.abort(), []);

  const start = async (hypothesis: HypothesisRef | null) => {
    if (!core) return;
    abort.current?.abort();
    const controller = new AbortController();
    abort.current = controller;
    const search = hypothesis === null;
    setPhase({ kind: 'running', done: 0, total: 0, search });
    try {
      const declared = parseModelConfig(core.modelConfig);
      const bytes = await fetchBytes(`/api/sessions/${session.id}/samples`, controller.signal);
      const result = await runExplain(bytes, declared, hypothesis, (done, total) => setPhase({ kind: 'running', done, total, search }), controller.signal);
      const best = hypothesis ?? result.explanation!.hypotheses[0] ?? { label: 'the declared model', config: declared, fault: null };
      setPhase({ kind: 'done', result, best, search, run: ++runs.current });
    } catch (err) {
      if (controller.signal.aborted) setPhase({ kind: 'cancelled' });
      else setPhase({ kind: 'error', message: (err as Error).message });
    }
  };
  const cancel = () => abort.current?.abort();

  return (
    <section aria-labelledby="explain-title" className={panel} data-testid="explain-panel">
      <h2 id="explain-title" className={panelTitle}>
        Explain
      </h2>
      {session.sampleCount === 0 ? (
        <p className="text-sm text-ink-soft">This session holds no answers to explain.</p>
      ) : mismatches === 0 ? (
        <p className="text-sm" data-testid="explain-healthy">
          The core matches its model: all {count(session.sampleCount)} answers equal the declared model’s, bit for bit. There is nothing to explain.
        </p>
      ) : (
        <div className="grid gap-4">
          <p className="text-sm">
            {mismatches === null ? 'Some answers may differ from the declared model.' : `${count(mismatches)} of ${count(session.sampleCount)} answers differ from the declared model.`} Search for the
            configuration or RTL defect that reproduces them bit for bit.
          </p>
          {stored.isError && (
            <p role="alert" className="text-sm text-fail">
              The saved explanation could not be read: {stored.error.message}
            </p>
          )}
          {stored.data && <SavedExplanation saved={stored.data} core={core} canEdit={canEdit} onShow={(best) => void start(best)} busy={phase.kind === 'running'} />}
          <Controls phase={phase} ready={!!core} onStart={() => void start(null)} onCancel={cancel} />
          {phase.kind === 'done' && <Result phase={phase} sessionId={session.id} core={core!} canEdit={canEdit} />}
        </div>
      )}
    </section>
  );
}

function Controls({ phase, ready, onStart, onCancel }: { phase: Phase; ready: boolean; onStart: () => void; onCancel: () => void }) {
  if (phase.kind === 'running') {
    const share = phase.total ? phase.done / phase.total : 0;
    return (
      <div className="grid gap-1" aria-live="polite">
        <div className="flex items-center gap-3 text-sm">
          <span>{phase.search ? (phase.total ? `Trying hypotheses: ${count(phase.done)} of ${count(phase.total)}…` : 'Reading the answers…') : 'Drawing the differences…'}</span>
          <button type="button" className={`${btn} ml-auto`} onClick={onCancel}>
            Cancel
          </button>
        </div>
        <div role="progressbar" aria-label="Explaining the answers" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(share * 100)} className="h-2 overflow-hidden rounded bg-rule/60">
          <div className="h-full bg-signal" style={{ width: `${(share * 100).toFixed(1)}%` }} />
        </div>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button type="button" className={btnPrimary} disabled={!ready} onClick={onStart}>
        Explain in this browser
      </button>
      {phase.kind === 'cancelled' && <span className="text-sm text-ink-soft">Cancelled; nothing was saved.</span>}
      {phase.kind === 'error' && (
        <span role="alert" className="text-sm text-fail">
          {phase.message}
        </span>
      )}
    </div>
  );
}

function Result({ phase, sessionId, core, canEdit }: { phase: Extract<Phase, { kind: 'done' }>; sessionId: number; core: CoreRecord; canEdit: boolean }) {
  const save = useSaveExplanation(sessionId);
  const { result, best } = phase;
  const e = result.explanation;
  return (
    <div className="grid gap-4" data-testid="explain-result">
      {e && (
        <div className="grid gap-2">
          <p className="text-xs text-ink-soft" data-testid="explain-elapsed" data-elapsed-ms={Math.round(result.elapsedMs)} data-run={phase.run}>
            Searched in this browser in {(result.elapsedMs / 1000).toFixed(1)} s over {count(e.answered)} answers.
          </p>
          {/* Once saved, the server's own result shows above: not twice. */}
          {!save.isSuccess && <ExplanationSummary explanation={e} />}
          {canEdit && (
            <div className="flex flex-wrap items-center gap-3">
              <button type="button" className={btnPrimary} disabled={save.isPending} onClick={() => save.mutate()}>
                {save.isPending ? 'The server is searching…' : 'Save explanation'}
              </button>
              {save.isSuccess && <span className="text-sm text-pass">Saved: the server searched again and stored its own result (above).</span>}
              {save.isError && (
                <span role="alert" className="text-sm text-fail">
                  Not saved: {save.error.message}
                </span>
              )}
            </div>
          )}
        </div>
      )}
      <div className="grid gap-3 xl:grid-cols-2">
        <figure className="min-w-0">
          <figcaption className="mb-1 text-sm font-bold">Board − hypothesis ({best.label}), LSB</figcaption>
          <DiffChart data={result.curves.hypothesis} testId="chart-board-minus-hypothesis" />
        </figure>
        <figure className="min-w-0">
          <figcaption className="mb-1 text-sm font-bold">Board − declared model, LSB</figcaption>
          <DiffChart data={result.curves.declared} testId="chart-board-minus-declared" />
        </figure>
      </div>
      <TraceChooser key={best.label} config={parseModelConfig(core.modelConfig)} best={best} parting={result.curves.partingCodes} unexplained={result.curves.unexplainedCodes} />
    </div>
  );
}

function TraceChooser({ config, best, parting, unexplained }: { config: ModelConfig; best: HypothesisRef; parting: number[]; unexplained: number[] }) {
  const [text, setText] = useState(String(parting[0] ?? unexplained[0] ?? 0));
  const code = Number(text);
  let traces: { declared: CordicTrace; hypothesis: CordicTrace } | null = null;
  let problem: string | null = null;
  if (text.trim() === '' || !Number.isInteger(code)) problem = 'Give a whole angle code.';
  else {
    try {
      traces = { declared: traceFaulty(config, null, code), hypothesis: traceFaulty(best.config, best.fault, code) };
    } catch (err) {
      problem = (err as Error).message;
    }
  }
  const listId = 'explain-trace-codes';
  return (
    <div className="grid gap-2">
      <h3 className="text-sm font-bold">One code, step by step</h3>
      <label className="flex flex-wrap items-center gap-2 text-sm">
        Angle code
        <input className={`${input} w-40 font-mono`} list={listId} value={text} onChange={(e) => setText(e.target.value)} inputMode="numeric" aria-describedby="explain-trace-hint" />
      </label>
      <datalist id={listId}>
        {parting.map((c) => (
          <option key={`p${c}`} value={c}>
            the hypothesis differs from the declared model
          </option>
        ))}
        {unexplained.map((c) => (
          <option key={`u${c}`} value={c}>
            not reproduced by the hypothesis
          </option>
        ))}
      </datalist>
      <p id="explain-trace-hint" className="text-xs text-ink-soft">
        {parting.length ? `Codes where the hypothesis and the declared model differ, lowest first: ${parting.slice(0, 8).join(', ')}${parting.length > 8 ? '…' : ''}.` : 'The hypothesis gives the declared model’s answers on every answered code.'}
        {unexplained.length > 0 && ` Not reproduced: ${unexplained.slice(0, 8).join(', ')}${unexplained.length > 8 ? '…' : ''}.`}
      </p>
      {problem ? (
        <p role="alert" className="text-sm text-fail">
          {problem}
        </p>
      ) : (
        <TraceTable declared={traces!.declared} hypothesis={traces!.hypothesis} hypothesisLabel={best.label} />
      )}
    </div>
  );
}

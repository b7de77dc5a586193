// A saved explanation (the server's own search) on the session page, for either kind of core:
// when and by whom, the outcome and ranked hypotheses, and the decision on a configuration
// deviation that reproduces every answer (apply it to the core, or keep the core as declared).
import type { HypothesisRef } from '../../../../shared/explain';
import { ExplanationSummary } from '../../../components/explanation-summary';
import { configChanges } from '../../../components/explanation-words';
import { btn } from '../../../components/ui';
import type { CoreRecord } from '../../../lib/resources/cores';
import type { StoredExplanation } from '../../../lib/resources/explanations';
import { useDecideExplanation } from '../api/decide-explanation';

const count = (n: number) => n.toLocaleString('en-US');

/** Which configuration of the core an explanation's deviation applies to, in words. */
const configWords = (saved: StoredExplanation) => (saved.explanation.mode === 'vectoring' ? 'vectoring configuration' : 'model configuration');

/** `onShow`, for a rotating core, offers the differences and a trace of the best hypothesis (in this browser). */
export function SavedExplanation({ saved, core, canEdit, onShow, busy = false }: { saved: StoredExplanation; core: CoreRecord | undefined; canEdit: boolean; onShow?: (best: HypothesisRef) => void; busy?: boolean }) {
  const e = saved.explanation;
  // Differences and a trace are drawn for rotating cores only.
  const best = e.mode === 'vectoring' ? undefined : e.hypotheses[0];
  return (
    <div className="grid gap-2 rounded border border-rule p-3" data-testid="saved-explanation">
      <p className="text-xs text-ink-soft">
        Saved {new Date(saved.savedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}
        {saved.savedBy ? ` by ${saved.savedBy.name}` : ''}, searched by the server over {count(e.answered)} answers.
      </p>
      <ExplanationSummary explanation={e} />
      {onShow && best && e.outcome !== 'matches-model' && (
        <div>
          <button type="button" className={btn} disabled={busy || !core} onClick={() => onShow(best)}>
            Show the differences and a trace
          </button>
        </div>
      )}
      <Decision saved={saved} core={core} canEdit={canEdit} />
    </div>
  );
}

export function Decision({ saved, core, canEdit }: { saved: StoredExplanation; core: CoreRecord | undefined; canEdit: boolean }) {
  const decide = useDecideExplanation(saved.sessionId, core?.id ?? 0);
  if (saved.decision) {
    const who = saved.decision.by ? ` by ${saved.decision.by.name}` : '';
    return (
      <p className="text-sm" data-testid="explanation-decision">
        {saved.decision.choice === 'applied' ? `Applied to the core’s ${configWords(saved)}${who}.` : `The core was kept as declared${who}.`}
      </p>
    );
  }
  if (!saved.applicableConfig || !core) return null;
  const changes = configChanges(saved.explanation.declared, saved.applicableConfig);
  return (
    <div className="grid gap-2 rounded bg-signal-soft p-2 text-sm">
      <p>
        A configuration deviation reproduces every answer: <span className="font-mono">{changes.join(', ')}</span>.{' '}
        {canEdit ? `If the RTL is right as built, apply it to the core’s ${configWords(saved)}; if the design intent stands, keep the core as declared and fix the RTL.` : 'An engineer may apply it to the core or keep the core as declared.'}
      </p>
      {canEdit && (
        <div className="flex flex-wrap gap-2">
          <button type="button" className={btn} disabled={decide.isPending} onClick={() => decide.mutate('apply')}>
            Apply to the core
          </button>
          <button type="button" className={btn} disabled={decide.isPending} onClick={() => decide.mutate('keep')}>
            Keep the core as declared
          </button>
        </div>
      )}
      {decide.isError && (
        <p role="alert" className="text-fail">
          {decide.error.message}
        </p>
      )}
    </div>
  );
}


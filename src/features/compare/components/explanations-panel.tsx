// Each compared session's saved explanation, one line apiece: what reproduces its answers.
import { outcomeHeading, reproducedWords } from '../../../components/explanation-words';
import { panel, panelTitle } from '../../../components/ui';
import { useExplanations } from '../../../lib/resources/explanations';
import type { ComparedSession } from '../api/compare-types';
import { sessionName } from './chart-data';

export function ExplanationsPanel({ sessions }: { sessions: ComparedSession[] }) {
  const saved = useExplanations(sessions.map((s) => s.id));
  return (
    <section aria-labelledby="explanations-title" className={panel} data-testid="compare-explanations">
      <h2 id="explanations-title" className={panelTitle}>
        Explanations
      </h2>
      <ul className="grid gap-2 text-sm">
        {sessions.map((s, i) => {
          const q = saved[i];
          const e = q.data?.explanation;
          const best = e?.hypotheses[0];
          return (
            <li key={s.id} data-testid={`explanation-${s.id}`}>
              <span className="font-bold">{sessionName(s)}:</span>{' '}
              {q.isPending ? (
                <span className="text-ink-soft">reading…</span>
              ) : q.isError ? (
                <span className="text-fail">could not be read ({q.error.message})</span>
              ) : e ? (
                <>
                  {outcomeHeading(e)}
                  {best && e.outcome !== 'matches-model' && (
                    <>
                      {' '}
                      — best: {best.label}, {reproducedWords(best, e.answered)}
                    </>
                  )}
                </>
              ) : s.stats.modelMismatches === 0 && s.sampleCount > 0 ? (
                'the core matches its model'
              ) : (
                <span className="text-ink-soft">no explanation saved</span>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}

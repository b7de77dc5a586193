// A saved or fresh explanation in words: the outcome, the search's own summary, and the ranked
// hypotheses with how many answers each reproduces.
import type { AnyExplanation } from '../../shared/explain';
import { equivalentWords, outcomeHeading, outcomeTone, reproducedWords } from './explanation-words';

const TONE = { pass: 'border-pass bg-pass-soft', warn: 'border-signal bg-signal-soft', fail: 'border-fail bg-fail-soft' };

export function ExplanationSummary({ explanation: e, top = 5, headingLevel = 3 }: { explanation: AnyExplanation; top?: number; headingLevel?: 3 | 4 }) {
  const H = `h${headingLevel}` as const;
  const shown = e.outcome === 'matches-model' ? [] : e.hypotheses.slice(0, top);
  return (
    <div className="grid gap-2" data-testid="explanation-summary">
      <div className={`rounded border-l-4 px-3 py-2 ${TONE[outcomeTone(e)]}`}>
        <H className="font-bold" data-testid="explanation-outcome">
          {outcomeHeading(e)}
        </H>
        <p className="text-sm">{e.summary}</p>
      </div>
      {shown.length > 0 && (
        <ol className="grid list-decimal gap-1 pl-6 text-sm" aria-label="Hypotheses, best first" data-testid="explanation-hypotheses">
          {shown.map((h, i) => (
            <li key={`${i}-${h.label}`}>
              <span className={i === 0 ? 'font-bold' : ''}>{h.label}</span> — {reproducedWords(h, e.answered)}
              {h.equivalent.length > 0 && (
                <span className="block text-xs text-ink-soft" title={h.equivalent.map((q) => q.label).join('\n')}>
                  {equivalentWords(h.equivalent)}
                </span>
              )}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}

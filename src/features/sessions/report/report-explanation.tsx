// The report's explanation section: the saved explanation of the answers, or, for a session
// whose answers all equal the model, that the core matches its model.
import { ExplanationSummary } from '../../../components/explanation-summary';
import { useExplanation } from '../../../lib/resources/explanations';
import type { SessionRecord } from '../../../lib/resources/sessions';

export function ReportExplanation({ session, className }: { session: SessionRecord; className: string }) {
  const saved = useExplanation(session.id);
  // A vectoring core's session keeps its mismatches with its vectoring figures.
  const mismatches = session.stats.vectoring ? session.stats.vectoring.mismatches.count : session.stats.mismatches?.count;
  const healthy = session.sampleCount > 0 && mismatches === 0;
  if (session.sampleCount === 0 || saved.isPending) return null;
  return (
    <section aria-labelledby="r-explanation" className="break-inside-avoid" data-testid="report-explanation">
      <h2 id="r-explanation" className={className}>
        Explanation of the answers
      </h2>
      {saved.isError ? (
        <p role="alert" className="text-sm text-fail">
          The saved explanation could not be read: {saved.error.message}
        </p>
      ) : saved.data ? (
        <>
          <ExplanationSummary explanation={saved.data.explanation} headingLevel={3} />
          <p className="mt-1 text-xs text-ink-soft">
            Searched by the server{saved.data.savedBy ? ` for ${saved.data.savedBy.name}` : ''} on {new Date(saved.data.savedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}
            {saved.data.decision ? (saved.data.decision.choice === 'applied' ? `; the deviation was applied to the core’s ${saved.data.explanation.mode === 'vectoring' ? 'vectoring' : 'model'} configuration.` : '; the core was kept as declared.') : '.'}
          </p>
        </>
      ) : healthy ? (
        <p className="text-sm">The core matches its model: every answer equals the declared model’s, bit for bit.</p>
      ) : (
        <p className="text-sm text-ink-soft">{(mismatches ?? 0).toLocaleString('en-US')} answers differ from the model; no explanation has been saved for this session.</p>
      )}
    </section>
  );
}

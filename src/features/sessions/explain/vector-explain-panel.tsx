// The Explain panel of a vectoring core's session: the server searches the stored answers for the
// configuration deviation or defect that reproduces every angle and magnitude bit for bit, and
// saves its result with the session; the saved explanation shows as a rotating core's does.
import { btnPrimary, panel, panelTitle } from '../../../components/ui';
import type { CoreRecord } from '../../../lib/resources/cores';
import { useExplanation } from '../../../lib/resources/explanations';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { useSaveExplanation } from '../api/save-explanation';
import { SavedExplanation } from './saved-explanation';

const count = (n: number) => n.toLocaleString('en-US');

export function VectorExplainPanel({ session, core, canEdit }: { session: SessionRecord; core: CoreRecord | undefined; canEdit: boolean }) {
  const mismatches = session.stats.vectoring?.mismatches.count ?? null;
  const stored = useExplanation(session.id);
  const save = useSaveExplanation(session.id);
  return (
    <section aria-labelledby="explain-title" className={panel} data-testid="explain-panel">
      <h2 id="explain-title" className={panelTitle}>
        Explain
      </h2>
      {session.sampleCount === 0 ? (
        <p className="text-sm text-ink-soft">This session holds no answers to explain.</p>
      ) : (
        <div className="grid gap-4">
          <p className="text-sm" data-testid={mismatches === 0 ? 'explain-healthy' : undefined}>
            {mismatches === 0
              ? `The core matches its model: all ${count(session.sampleCount)} angles and magnitudes equal the declared model’s, bit for bit.`
              : `${mismatches === null ? 'Some answers may differ' : `${count(mismatches)} of ${count(session.sampleCount)} answers differ`} from the declared model. Search for the configuration or RTL defect that reproduces every angle and magnitude bit for bit.`}
          </p>
          {stored.isError && (
            <p role="alert" className="text-sm text-fail">
              The saved explanation could not be read: {stored.error.message}
            </p>
          )}
          {stored.data && <SavedExplanation saved={stored.data} core={core} canEdit={canEdit} />}
          {canEdit && mismatches !== 0 && (
            <div className="flex flex-wrap items-center gap-3" aria-live="polite">
              <button type="button" className={btnPrimary} disabled={save.isPending || !core} onClick={() => save.mutate()}>
                {save.isPending ? 'The server is searching…' : stored.data ? 'Explain again on the server' : 'Explain on the server'}
              </button>
              {save.isError && (
                <span role="alert" className="text-sm text-fail">
                  Not explained: {save.error.message}
                </span>
              )}
            </div>
          )}
          {!canEdit && !stored.data && mismatches !== 0 && <p className="text-sm text-ink-soft">An engineer may run the search; its result shows here once saved.</p>}
        </div>
      )}
    </section>
  );
}

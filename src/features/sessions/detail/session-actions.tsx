import { Link } from 'react-router-dom';
import { btn, fieldError, panel, panelTitle } from '../../../components/ui';
import type { CoreRecord } from '../../../lib/resources/cores';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { useUpdateSession } from '../api/update-session';

const linkBtn = `${btn} inline-block no-underline`;

/** The session as a JSON file: the record as the server keeps it, without the sample blobs. */
function downloadSummary(session: SessionRecord) {
  const blob = new Blob([JSON.stringify(session, null, 2)], { type: 'application/json' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = `session-${session.id}.json`;
  a.click();
  // Revoked after the click has been handled, or the download may not start.
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function SessionActions({ session, core, canEdit }: { session: SessionRecord; core: CoreRecord | undefined; canEdit: boolean }) {
  const update = useUpdateSession(session.id, session.coreId);
  const baselineId = core?.baselineSessionId ?? null;
  const isBaseline = baselineId === session.id;
  return (
    <section aria-labelledby="actions-title" className={panel}>
      <h2 id="actions-title" className={panelTitle}>
        Baseline, compare and export
      </h2>
      <p className="mb-2 text-sm" data-testid="baseline-state">
        {core === undefined
          ? 'Reading the core…'
          : isBaseline
            ? 'This session is its core’s baseline: new sessions that fail a limit it met are regressions.'
            : baselineId
              ? `The core’s baseline is session #${baselineId}.`
              : 'The core has no baseline yet.'}
      </p>
      <div className="flex flex-wrap gap-2">
        {canEdit && session.passed && core && !isBaseline && (
          <button type="button" className={btn} disabled={update.isPending} onClick={() => update.mutate({ baseline: true })}>
            {update.isPending ? 'Setting…' : 'Set as baseline'}
          </button>
        )}
        {baselineId && !isBaseline && (
          <Link className={linkBtn} to={`/compare?ids=${baselineId},${session.id}`}>
            Compare with baseline
          </Link>
        )}
        <a className={linkBtn} href={`/api/sessions/${session.id}/export.csv`} download>
          Export CSV
        </a>
        <button type="button" className={btn} onClick={() => downloadSummary(session)}>
          Export JSON
        </button>
        <Link className={linkBtn} to={`/sessions/${session.id}/report`}>
          Printable report
        </Link>
      </div>
      {update.isError && (
        <p role="alert" className={`${fieldError} mt-2`}>
          Not set as baseline: {update.error.message}
        </p>
      )}
    </section>
  );
}

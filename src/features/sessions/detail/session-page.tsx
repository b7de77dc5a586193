import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../../components/ui';
import { useMe } from '../../auth/api/get-me';
import { useCore } from '../../../lib/resources/core-detail';
import { useSession } from '../../../lib/resources/sessions';
import { CapturePane } from '../capture/capture-pane';
import { LocalBoundary } from '../components/local-boundary';
import { SessionFacts } from '../components/session-facts';
import { SessionStats } from '../components/session-stats';
import { VectorSessionStats } from '../components/vector-session-stats';
import { RegressionBadge, VerdictBadge } from '../components/verdict-badges';
import { VerdictTable } from '../components/verdict-table';
import { ExplainPanel } from '../explain/explain-panel';
import { VectorExplainPanel } from '../explain/vector-explain-panel';
import { CommentsPanel } from './comments-panel';
import { NotesPanel } from './notes-panel';
import { SessionActions } from './session-actions';
import { SessionCharts } from './session-charts';
import { VectorSessionCharts } from './vector-session-charts';
import { SettingsPanel } from './settings-panel';
import { SoakPanel } from '../soak/soak-panel';

/** One stored session: what ran, how it scored, the plots, the capture, and the talk about it. */
export function SessionPage({ id }: { id: number }) {
  const me = useMe().data;
  const query = useSession(id);
  const core = useCore(query.data?.coreId ?? null);
  if (query.isPending) return <p className="text-ink-soft">Loading session #{id}…</p>;
  if (query.isError) {
    const missing = 'status' in query.error && query.error.status === 404;
    return (
      <div role="alert" className="max-w-xl rounded border border-fail bg-fail-soft p-4">
        <h1 className="mb-1 text-xl font-bold">{missing ? `There is no session #${id}` : `Session #${id} could not be loaded`}</h1>
        <p className="mb-2">{missing ? 'It may have been deleted.' : query.error.message}</p>
        <Link className="underline" to="/sessions">
          Back to the sessions
        </Link>
      </div>
    );
  }
  const s = query.data;
  const canEdit = me?.role === 'engineer' || me?.role === 'admin';
  // A vectoring core's session: angle and magnitude figures and plots, the server's defect search; no soak.
  const vectoring = s.core?.mode === 'vectoring';
  return (
    <div className="grid gap-4">
      <header className="flex flex-wrap items-center gap-3">
        <p className="w-full text-sm">
          <Link className="underline" to="/sessions">
            Sessions
          </Link>{' '}
          / #{s.id}
        </p>
        <h1 className="text-2xl font-bold">
          Session #{s.id} <span className="font-normal text-ink-soft">· {s.core?.name ?? `core #${s.coreId}`}</span>
        </h1>
        <VerdictBadge passed={s.passed} className="text-sm" />
        {s.regression && <RegressionBadge />}
      </header>
      <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_26rem]">
        <div className="grid min-w-0 gap-4">
          <section aria-labelledby="facts-title" className={panel}>
            <h2 id="facts-title" className={panelTitle}>
              Session
            </h2>
            <SessionFacts session={s} />
          </section>
          <section aria-labelledby="verdict-title" className={panel}>
            <h2 id="verdict-title" className={panelTitle}>
              Verdict per limit
            </h2>
            <VerdictTable verdict={s.verdict} />
          </section>
          {!vectoring && <SoakPanel conditions={s.conditions} soak={s.soak} modelConfig={core.data?.core.modelConfig ?? undefined} />}
          <LocalBoundary what="plots">
            {vectoring ? <VectorSessionCharts session={s} config={core.data?.core.vectorConfig ?? undefined} /> : <SessionCharts session={s} config={core.data?.core.modelConfig ?? undefined} />}
          </LocalBoundary>
          {core.isError && (
            <p role="alert" className="text-sm font-bold text-fail">
              The core could not be read, so the plots cannot be scored: {core.error.message}
            </p>
          )}
          <LocalBoundary what="explanation">
            {vectoring ? <VectorExplainPanel session={s} core={core.data?.core} canEdit={canEdit} /> : <ExplainPanel session={s} core={core.data?.core} canEdit={canEdit} />}
          </LocalBoundary>
          <LocalBoundary what="capture">
            <CapturePane sessionId={s.id} hasArchive={!!s.hasArchive} />
          </LocalBoundary>
          <SettingsPanel deviceInfo={s.deviceInfo} plan={s.plan} transport={s.transport} />
        </div>
        <div className="grid min-w-0 gap-4">
          <section aria-labelledby="stats-title" className={panel}>
            <h2 id="stats-title" className={panelTitle}>
              Figures
            </h2>
            {vectoring ? <VectorSessionStats stats={s.stats.vectoring} /> : <SessionStats stats={s.stats} />}
          </section>
          <SessionActions session={s} core={core.data?.core} canEdit={canEdit} />
          <NotesPanel key={s.updatedAt} session={s} canEdit={canEdit} />
          {me && (
            <LocalBoundary what="comments">
              <CommentsPanel sessionId={s.id} me={me} />
            </LocalBoundary>
          )}
        </div>
      </div>
    </div>
  );
}

// A one- or two-page report of a session for the file: on screen with a Print button, on paper
// without the app's chrome (print: variants; the layout hides its header when printing).
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { SignalCharts, staticFeed } from '../../../components/charts/signal-charts';
import { btnPrimary } from '../../../components/ui';
import { useBuild } from '../../../lib/resources/build-detail';
import { useCore } from '../../../lib/resources/core-detail';
import { useSession } from '../../../lib/resources/sessions';
import { ReportExplanation } from './report-explanation';
import { useSessionPlots, useVectorSessionPlots } from '../api/get-session-plots';
import { vectorStatRows } from '../../../components/vector-stat-rows';
import { SessionFacts } from '../components/session-facts';
import { statRows } from '../components/session-stats';
import { RegressionBadge, VerdictBadge } from '../components/verdict-badges';
import { VerdictTable } from '../components/verdict-table';

const h2 = 'mb-2 border-b border-ink/40 pb-0.5 text-sm font-bold uppercase tracking-wider';

export function SessionReport({ id }: { id: number }) {
  const query = useSession(id);
  const s = query.data;
  const core = useCore(s?.coreId ?? null);
  const build = useBuild(s?.buildId ?? null);
  // A vectoring session's report plots its angle error against direction, from its own scoring.
  const vectoring = s?.core?.mode === 'vectoring';
  const rotationPlots = useSessionPlots(id, vectoring ? undefined : (core.data?.core.modelConfig ?? undefined));
  const vectorPlots = useVectorSessionPlots(id, vectoring ? (core.data?.core.vectorConfig ?? undefined) : undefined);
  const plots = vectoring ? vectorPlots : rotationPlots;
  const feed = useMemo(
    () => (vectorPlots.data ? staticFeed({ angleError: vectorPlots.data.charts.angleError }) : rotationPlots.data ? staticFeed({ error: rotationPlots.data.charts.error }) : null),
    [vectorPlots.data, rotationPlots.data],
  );

  if (query.isPending) return <p className="text-ink-soft">Preparing the report of session #{id}…</p>;
  if (query.isError) {
    return (
      <p role="alert" className="font-bold text-fail">
        The report could not be made: {query.error.message}
      </p>
    );
  }
  const session = query.data;
  const sha = build.data?.sha256;
  return (
    <article className="mx-auto grid max-w-4xl gap-5 bg-white p-8 text-ink shadow-sm print:max-w-none print:p-0 print:shadow-none" aria-labelledby="report-title">
      <div className="flex items-center gap-2 print:hidden">
        <Link className="mr-auto text-sm underline" to={`/sessions/${id}`}>
          Back to session #{id}
        </Link>
        <button type="button" className={btnPrimary} onClick={() => window.print()}>
          Print
        </button>
      </div>
      <header className="flex flex-wrap items-baseline gap-3 border-b-2 border-ink pb-2">
        <h1 id="report-title" className="mr-auto text-2xl font-bold">
          Bench session #{session.id} — {session.core?.name ?? `core #${session.coreId}`}
        </h1>
        <VerdictBadge passed={session.passed} className="text-sm print:border print:border-current" />
        {session.regression && <RegressionBadge />}
      </header>
      <section aria-labelledby="r-facts">
        <h2 id="r-facts" className={h2}>
          What was tested
        </h2>
        <SessionFacts
          session={session}
          links={false}
          buildExtra={sha ? <span className="block break-all font-mono text-xs text-ink-soft">SHA-256 {sha}</span> : session.buildId ? <span className="block text-xs text-ink-soft">no bitstream file on record</span> : null}
        />
      </section>
      <section aria-labelledby="r-verdict" className="break-inside-avoid">
        <h2 id="r-verdict" className={h2}>
          Verdict per limit
        </h2>
        <VerdictTable verdict={session.verdict} />
      </section>
      <section aria-labelledby="r-stats" className="break-inside-avoid">
        <h2 id="r-stats" className={h2}>
          Key figures
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-sm sm:grid-cols-[auto_1fr_auto_1fr]">
          {(vectoring ? vectorStatRows(session.stats.vectoring).map((r): [string, string] => [r.label, r.value]) : statRows(session.stats)).map(([k, v]) => (
            <div key={k} className="contents">
              <dt className="text-ink-soft">{k}</dt>
              <dd className="font-mono">{v}</dd>
            </div>
          ))}
        </dl>
      </section>
      <section aria-labelledby="r-plot" className="break-inside-avoid">
        <h2 id="r-plot" className={h2}>
          {vectoring ? 'Angle error against direction, LSB' : 'Error against angle, LSB'}
        </h2>
        {session.sampleCount === 0 ? (
          <p className="text-sm text-ink-soft">No samples to plot.</p>
        ) : plots.isError ? (
          <p role="alert" className="text-sm text-fail">
            The plot could not be drawn: {plots.error.message}
          </p>
        ) : feed ? (
          <SignalCharts charts={vectoring ? ['angleError'] : ['error']} feed={feed} heightPx={240} className="grid" showTitles={false} />
        ) : (
          <p className="text-sm text-ink-soft">Scoring the stored samples for the plot…</p>
        )}
      </section>
      <ReportExplanation session={session} className={h2} />
      <section aria-labelledby="r-notes" className="break-inside-avoid">
        <h2 id="r-notes" className={h2}>
          Notes
        </h2>
        <p className="whitespace-pre-wrap text-sm">{session.notes || 'No notes.'}</p>
        {session.tags.length > 0 && <p className="mt-1 text-sm text-ink-soft">Tags: {session.tags.join(', ')}</p>}
      </section>
      <footer className="border-t border-rule pt-1 text-xs text-ink-soft">Anglebench report of session #{session.id}, made {new Date().toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}.</footer>
    </article>
  );
}

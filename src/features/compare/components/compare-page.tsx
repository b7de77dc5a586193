import { useSearchParams } from 'react-router-dom';
import { useCompare } from '../api/get-compare';
import { formatIds, parseIds } from './compare-ids';
import { DiffPanel } from './diff-panel';
import { ExplanationsPanel } from './explanations-panel';
import { OverlayCharts } from './overlay-charts';
import { SessionPicker } from './session-picker';
import { StatsTable } from './stats-table';
import { VerdictsPanel } from './verdicts-panel';

/** /compare?ids=a,b,…: sessions overlaid, side by side, and the first against the others bit for bit. */
export function ComparePage() {
  const [params, setParams] = useSearchParams();
  const ids = parseIds(params.get('ids'));
  const compare = useCompare(ids);
  const setIds = (next: number[]) => {
    const p = new URLSearchParams(params);
    if (next.length) p.set('ids', formatIds(next));
    else p.delete('ids');
    setParams(p);
  };
  // While a new choice loads, the previous comparison stays up but is not taken for the new one.
  const data = compare.data && compare.data.sessions.map((s) => s.id).join(',') === formatIds(ids) ? compare.data : null;

  return (
    <div className="grid gap-4">
      <h1 className="text-3xl font-bold">Compare sessions</h1>
      <SessionPicker ids={ids} coreId={data?.sessions[0]?.core.id ?? null} onChange={setIds} />
      {ids.length < 2 && <p className="text-ink-soft">Choose at least two sessions. The first is the reference the others are measured against.</p>}
      {ids.length >= 2 && compare.isFetching && !data && <p className="text-ink-soft">Comparing…</p>}
      {ids.length >= 2 && compare.isError && (
        <p role="alert" className="text-fail">
          The sessions could not be compared: {compare.error.message}
        </p>
      )}
      {data && (
        <>
          <VerdictsPanel sessions={data.sessions} />
          <OverlayCharts sessions={data.sessions} />
          <StatsTable sessions={data.sessions} />
          <DiffPanel sessions={data.sessions} pairs={data.pairs} />
          <ExplanationsPanel sessions={data.sessions} />
        </>
      )}
    </div>
  );
}

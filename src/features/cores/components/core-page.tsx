import { Link } from 'react-router-dom';
import { fieldError, panel, panelTitle } from '../../../components/ui';
import { ApiError } from '../../../lib/api';
import { useCore } from '../../../lib/resources/core-detail';
import { BaselinePanel } from './baseline-panel';
import { CoreEditor } from './core-editor';
import { CoreValues } from './core-values';
import { modelSummary } from './cores-table';
import { GoldenVectorsPanel } from './golden-vectors-panel';
import { WatchPanel } from './watch-toggle';

/** /cores/:id: the core's settings (a form for engineers, values for reviewers), baseline, watchers and golden vectors. */
export function CorePage({ id, canEdit }: { id: number; canEdit: boolean }) {
  const q = useCore(id);
  if (q.isPending) return <p className="text-ink-soft">Loading the core…</p>;
  if (q.isError) {
    return (
      <p role="alert" className={fieldError}>
        {q.error instanceof ApiError && q.error.status === 404 ? 'There is no such core.' : `The core could not be loaded: ${q.error.message}`}{' '}
        <Link to="/cores" className="underline">All cores</Link>
      </p>
    );
  }
  const { core, watchers, watching } = q.data;
  return (
    <div className="grid gap-4">
      <div>
        <p className="text-sm"><Link to="/cores" className="underline">Cores</Link> /</p>
        <h1 className="text-2xl font-bold">{core.name}</h1>
        <p className="text-sm text-ink-soft">
          <span className="font-mono">{core.slug}</span> · {modelSummary(core)} ·{' '}
          <Link to={`/sessions?coreId=${core.id}`} className="underline">Sessions of this core</Link>
        </p>
      </div>

      <div className="grid gap-4 lg:grid-cols-2">
        <section className={panel} aria-labelledby="baseline-title">
          <h2 id="baseline-title" className={panelTitle}>Baseline</h2>
          <BaselinePanel coreId={core.id} sessionId={core.baselineSessionId} canEdit={canEdit} />
        </section>
        <section className={panel} aria-labelledby="watch-title">
          <h2 id="watch-title" className={panelTitle}>Watchers</h2>
          <WatchPanel coreId={core.id} watchers={watchers} watching={watching} />
        </section>
      </div>

      {canEdit ? <CoreEditor core={core} /> : <CoreValues core={core} />}

      <section className={panel} aria-labelledby="gv-title">
        <h2 id="gv-title" className={panelTitle}>Golden vectors</h2>
        <GoldenVectorsPanel coreId={core.id} canEdit={canEdit} />
      </section>
    </div>
  );
}

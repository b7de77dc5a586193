import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../../components/ui';
import { useMe } from '../../auth/api/get-me';
import { useBuild } from '../../../lib/resources/build-detail';
import { BitstreamPanel } from './bitstream-panel';
import { formatMHz, formatWhen, STATUS_LOOK } from './build-format';
import { BuildSessions } from './build-sessions';
import { ReviewPanel } from './review-panel';
import { StatusBadge } from './status-badge';

/** /builds/:id: one bitstream, its status, file, sessions and review trail. */
export function BuildPage({ id }: { id: number }) {
  const role = useMe().data?.role;
  const build = useBuild(id);
  if (build.isPending) return <p className="text-ink-soft">Loading the build…</p>;
  if (build.isError) {
    return (
      <p role="alert" className="text-fail">
        The build could not be loaded: {build.error.message} <Link to="/builds" className="underline">Back to the builds</Link>
      </p>
    );
  }
  const b = build.data;
  const engineer = role === 'engineer' || role === 'admin';
  const facts: Array<[string, string]> = [
    ['Source revision', b.sourceRevision],
    ['Tool version', b.toolVersion],
    ['Clock', formatMHz(b.clockMHz)],
    ['Created', `${formatWhen(b.createdAt)} by ${b.createdBy?.name ?? 'unknown'}`],
    ['Sessions', `${b.sessionCount.toLocaleString('en-US')}${b.lastSessionAt ? `, latest run ${formatWhen(b.lastSessionAt)}` : ''}`],
  ];

  return (
    <div className="grid gap-4">
      <div>
        <p className="text-sm text-ink-soft">
          <Link to="/builds" className="underline">Builds</Link> /{' '}
          <Link to={`/builds?core=${b.coreId}`} className="underline">{b.core?.name ?? `core ${b.coreId}`}</Link>
        </p>
        <div className="flex flex-wrap items-center gap-4">
          <h1 className="text-3xl font-bold">Build {b.label}</h1>
          <StatusBadge status={b.status} large />
          <span className="text-sm text-ink-soft">{STATUS_LOOK[b.status].hint}</span>
        </div>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-labelledby="details-title" className={panel}>
          <h2 id="details-title" className={panelTitle}>
            Details
          </h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            {facts.map(([k, v]) => (
              <div key={k} className="contents">
                <dt className="text-ink-soft">{k}</dt>
                <dd className={k === 'Source revision' ? 'font-mono' : undefined}>{v}</dd>
              </div>
            ))}
          </dl>
          {b.notes && <p className="mt-3 whitespace-pre-wrap text-sm">{b.notes}</p>}
        </section>
        <BitstreamPanel build={b} canUpload={engineer} />
        <ReviewPanel buildId={b.id} canRequest={engineer} />
        <BuildSessions buildId={b.id} />
      </div>
    </div>
  );
}

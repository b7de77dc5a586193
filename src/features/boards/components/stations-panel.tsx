import { panel, panelTitle, fieldError } from '../../../components/ui';
import { StationsTable } from '../../../components/stations-table';
import { useStations } from '../../../lib/resources/stations';

/** The Boards page's view of the stations online: boards on lab PCs, reachable from the Bench page. */
export function StationsPanel() {
  const stations = useStations();
  return (
    <section className={panel} aria-labelledby="stations-title">
      <h2 id="stations-title" className={panelTitle}>
        Stations online
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Boards on lab PCs whose bridge dials this server (<code className="font-mono">npm run cli -- bridge --server …</code>). Drive one from the Bench page.
      </p>
      {stations.isPending && <p className="text-sm text-ink-soft">Asking the server…</p>}
      {stations.isError && <p role="alert" className={fieldError}>The stations could not be listed: {stations.error.message}</p>}
      {stations.data?.length === 0 && <p className="text-sm text-ink-soft">No station is online.</p>}
      {stations.data && stations.data.length > 0 && <StationsTable stations={stations.data} bare />}
    </section>
  );
}

import type { UseFormRegisterReturn } from 'react-hook-form';
import { sinceText, useStations } from '../../../lib/resources/stations';

/**
 * The stations online to connect to, one radio each. A station somebody else drives says by whom
 * and since when, and cannot be chosen; the list refreshes by itself.
 */
export function StationPicker({ reg, error }: { reg: UseFormRegisterReturn; error?: string }) {
  const stations = useStations();
  return (
    <fieldset className="grid gap-1.5 text-sm" data-testid="station-picker">
      <legend className="mb-1 font-bold">Station</legend>
      {stations.isPending && <p className="text-ink-soft">Asking the server for stations…</p>}
      {stations.isError && <p role="alert" className="text-fail">The stations could not be listed: {stations.error.message}</p>}
      {stations.data?.length === 0 && (
        <p className="text-xs text-ink-soft">
          No station is online. On the PC the board is plugged into, run <code className="font-mono">npm run cli -- bridge --server {window.location.origin} --token … --device … --name …</code>
        </p>
      )}
      {stations.data?.map((s) => (
        <label key={s.name} className={`flex items-start gap-2 ${s.inUse ? 'text-ink-soft' : ''}`}>
          <input type="radio" value={s.name} disabled={s.inUse !== null} className="mt-1" {...reg} />
          <span>
            <span className="font-bold">{s.name}</span> · <span className="font-mono">{s.device}</span> · {s.baud.toLocaleString()} baud
            <span className="block text-xs">{s.inUse ? `In use by ${s.inUse.by}, ${sinceText(s.inUse.since)}` : `Free · registered by ${s.owner}`}</span>
          </span>
        </label>
      ))}
      {error && <span className="text-xs text-fail">{error}</span>}
    </fieldset>
  );
}

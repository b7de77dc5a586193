import { panel, panelTitle } from '../../../components/ui';
import { linkFigureRows, type FigureRow } from './link-figure-rows';

const value = (v: unknown): string => (v === null || v === undefined ? '—' : typeof v === 'object' ? JSON.stringify(v) : String(v));

function KeyValues({ title, data, empty }: { title: string; data: Record<string, unknown> | null | undefined; empty: string }) {
  return <Rows title={title} rows={Object.entries(data ?? {}).map(([k, v]) => ({ label: k, value: value(v) }))} empty={empty} />;
}

// A wide list puts two label/value pairs on a line where there is room.
const NARROW = 'grid-cols-[auto_minmax(0,1fr)]';
const WIDE = 'grid-cols-[auto_minmax(0,1fr)] sm:grid-cols-[auto_minmax(0,1fr)_auto_minmax(0,1fr)]';

function Rows({ title, rows, empty, wide = false, className = '' }: { title: string; rows: FigureRow[]; empty: string; wide?: boolean; className?: string }) {
  return (
    <div className={`min-w-0 ${className}`}>
      <h3 className="mb-1 text-sm font-bold">{title}</h3>
      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <dl aria-label={title} className={`grid ${wide ? WIDE : NARROW} gap-x-3 gap-y-0.5 text-sm`}>
          {rows.map(({ label, value }) => (
            <div key={label} className="contents">
              <dt className="text-ink-soft">{label}</dt>
              <dd className="break-words font-mono tabular-nums">{value}</dd>
            </div>
          ))}
        </dl>
      )}
    </div>
  );
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** What the session ran: the device's INFO, the plan and the link settings, as recorded. */
export function SettingsPanel({ deviceInfo, plan, transport }: { deviceInfo: Record<string, unknown> | null; plan: Record<string, unknown>; transport: Record<string, unknown> }) {
  // The server files the run's link figures inside the transport; they read as their own list.
  const { linkFigures, ...rest } = transport;
  const link = isRecord(linkFigures) ? rest : transport;
  return (
    <section aria-labelledby="settings-title" className={panel}>
      <h2 id="settings-title" className={panelTitle}>
        Device, plan and link
      </h2>
      <div className="grid gap-4 md:grid-cols-3">
        <KeyValues title="Device INFO" data={deviceInfo} empty="The device's INFO was not recorded." />
        <KeyValues title="Plan" data={plan} empty="No plan was recorded." />
        <KeyValues title="Transport" data={link} empty="No link settings were recorded." />
        {isRecord(linkFigures) && <Rows title="Link figures" rows={linkFigureRows(linkFigures)} empty="No link figures were recorded." wide className="md:col-span-3" />}
      </div>
    </section>
  );
}

import { panel, panelTitle } from '../../../components/ui';

const value = (v: unknown): string => (v === null || v === undefined ? '—' : typeof v === 'object' ? JSON.stringify(v) : String(v));

function KeyValues({ title, data, empty }: { title: string; data: Record<string, unknown> | null | undefined; empty: string }) {
  const entries = Object.entries(data ?? {});
  return (
    <div className="min-w-0">
      <h3 className="mb-1 text-sm font-bold">{title}</h3>
      {entries.length === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5 text-sm">
          {entries.map(([k, v]) => (
            <div key={k} className="contents">
              <dt className="text-ink-soft">{k}</dt>
              <dd className="break-words font-mono">{value(v)}</dd>
            </div>
          ))}
        </dl>
      )}
    </div>
  );
}

/** What the session ran: the device's INFO, the plan and the link settings, as recorded. */
export function SettingsPanel({ deviceInfo, plan, transport }: { deviceInfo: Record<string, unknown> | null; plan: Record<string, unknown>; transport: Record<string, unknown> }) {
  return (
    <section aria-labelledby="settings-title" className={panel}>
      <h2 id="settings-title" className={panelTitle}>
        Device, plan and link
      </h2>
      <div className="grid gap-4 md:grid-cols-3">
        <KeyValues title="Device INFO" data={deviceInfo} empty="The device's INFO was not recorded." />
        <KeyValues title="Plan" data={plan} empty="No plan was recorded." />
        <KeyValues title="Transport" data={transport} empty="No link settings were recorded." />
      </div>
    </section>
  );
}

import { useState } from 'react';
import { fieldError } from '../../../components/ui';
import { useAudit, type AuditEntry } from '../api/get-audit';
import type { TeamUser } from '../api/get-users';
import { Pager } from './pager';

const LIMIT = 20;
const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit' });

/** "maxAbsErrorLsb: 3, role: engineer": the change's details as short text (never markup). */
function detailText(e: AuditEntry): string {
  if (!e.detail) return '';
  return Object.entries(e.detail)
    .map(([k, v]) => `${k}: ${typeof v === 'object' && v !== null ? JSON.stringify(v) : String(v)}`)
    .join(', ');
}

/** Who changed what, newest first, a page at a time. */
export function AuditLog({ users }: { users: TeamUser[] }) {
  const [offset, setOffset] = useState(0);
  const q = useAudit(offset, LIMIT);
  const who = (id: number | null) => (id === null ? 'system' : (users.find((u) => u.id === id)?.name ?? `user ${id}`));
  if (q.isPending) return <p className="text-sm text-ink-soft">Loading the audit log…</p>;
  if (q.isError) return <p role="alert" className={fieldError}>The audit log could not be loaded: {q.error.message}</p>;
  const { entries, total } = q.data;
  if (total === 0) return <p className="text-sm text-ink-soft">Nothing has been changed yet.</p>;
  return (
    <div className="grid gap-3">
      <div className="overflow-x-auto">
        <table className="w-full table-fixed text-sm" aria-label="Audit log">
          <colgroup>
            <col className="w-44" />
            <col className="w-40" />
            <col className="w-28" />
            <col className="w-36" />
            <col />
          </colgroup>
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wider text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">When</th>
              <th scope="col" className="px-3 py-2">Who</th>
              <th scope="col" className="px-3 py-2">Action</th>
              <th scope="col" className="px-3 py-2">Object</th>
              <th scope="col" className="px-3 py-2">Details</th>
            </tr>
          </thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id} className="border-b border-rule/60 align-top last:border-0">
                <td className="px-3 py-1.5 whitespace-nowrap">{when(e.at)}</td>
                <td className="px-3 py-1.5">{who(e.userId)}</td>
                <td className="px-3 py-1.5 font-mono text-xs">{e.action}</td>
                <td className="px-3 py-1.5">{e.entity}{e.entityId !== null ? ` #${e.entityId}` : ''}</td>
                <td className="px-3 py-1.5 font-mono text-xs break-words text-ink-soft">{detailText(e)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Pager offset={offset} limit={LIMIT} total={total} onChange={setOffset} label="Audit log pages" />
    </div>
  );
}

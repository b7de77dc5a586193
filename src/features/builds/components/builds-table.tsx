import { DataTable, type PlainColumn } from '../../../components/data-table';
import { Link } from 'react-router-dom';
import type { BuildRecord } from '../../../lib/resources/builds';
import { formatBytes, formatMHz, formatWhen, shortSha } from './build-format';
import { StatusBadge } from './status-badge';

const mono = 'font-mono text-xs';

const columns: PlainColumn<BuildRecord>[] = [
  {
    id: 'label',
    header: 'Build',
    accessorFn: (b) => b.label,
    cell: ({ row }) => (
      <Link to={`/builds/${row.original.id}`} className="font-bold underline decoration-rule underline-offset-2 hover:decoration-signal">
        {row.original.label}
      </Link>
    ),
  },
  { id: 'core', header: 'Core', accessorFn: (b) => b.core?.slug ?? `core ${b.coreId}`, cell: ({ getValue }) => <span className={mono}>{String(getValue())}</span> },
  { id: 'revision', header: 'Source revision', accessorFn: (b) => b.sourceRevision, cell: ({ getValue }) => <span className={mono}>{String(getValue())}</span> },
  { id: 'tool', header: 'Tool version', accessorFn: (b) => b.toolVersion },
  { id: 'clock', header: 'Clock', accessorFn: (b) => formatMHz(b.clockMHz), cell: ({ getValue }) => <span className="whitespace-nowrap">{String(getValue())}</span> },
  {
    id: 'file',
    header: 'Bitstream',
    accessorFn: (b) => b.fileName,
    cell: ({ row }) => {
      const b = row.original;
      if (!b.fileName || b.sha256 === null || b.fileSize === null) return <span className="text-ink-soft">none uploaded</span>;
      return (
        <span className="grid">
          <span className="break-all">{b.fileName}</span>
          <span className="text-xs text-ink-soft">
            {formatBytes(b.fileSize)} · <span className={mono} title={`SHA-256 ${b.sha256}`}>{shortSha(b.sha256)}…</span>
          </span>
        </span>
      );
    },
  },
  { id: 'status', header: 'Status', accessorFn: (b) => b.status, cell: ({ row }) => <StatusBadge status={row.original.status} /> },
  {
    id: 'sessions',
    header: 'Sessions',
    accessorFn: (b) => b.sessionCount,
    cell: ({ row }) => (
      <span className="grid">
        <span>{row.original.sessionCount.toLocaleString('en-US')}</span>
        {row.original.lastSessionAt && <span className="text-xs text-ink-soft whitespace-nowrap">last {formatWhen(row.original.lastSessionAt)}</span>}
      </span>
    ),
  },
  {
    id: 'created',
    header: 'Created',
    accessorFn: (b) => b.createdAt,
    cell: ({ row }) => (
      <span className="grid">
        <span>{row.original.createdBy?.name ?? 'unknown'}</span>
        <span className="text-xs text-ink-soft whitespace-nowrap">{formatWhen(row.original.createdAt)}</span>
      </span>
    ),
  },
];

/** The builds, newest first, one row each. */
export function BuildsTable({ builds }: { builds: BuildRecord[] }) {
  return <DataTable columns={columns} data={builds} label="Builds" rowTestId={(b) => `build-row-${b.id}`} />;
}

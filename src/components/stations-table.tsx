import type { StationListing } from '../../shared/contract/stations';
import { sinceText } from '../lib/resources/stations';
import { DataTable, type PlainColumn } from './data-table';

const columns: PlainColumn<StationListing>[] = [
  { id: 'name', header: 'Station', accessorFn: (s) => s.name, cell: ({ getValue }) => <span className="font-bold">{String(getValue())}</span> },
  { id: 'device', header: 'Device', accessorFn: (s) => s.device, cell: ({ getValue }) => <span className="font-mono">{String(getValue())}</span> },
  { id: 'baud', header: 'Baud', accessorFn: (s) => s.baud.toLocaleString() },
  { id: 'owner', header: 'Registered by', accessorFn: (s) => s.owner },
  {
    id: 'inUse',
    header: 'In use',
    accessorFn: (s) => s.inUse?.by ?? '',
    cell: ({ row }) => {
      const u = row.original.inUse;
      return u ? <span className="rounded bg-signal-soft px-1.5 font-bold">{`${u.by}, ${sinceText(u.since)}`}</span> : <span className="text-pass">free</span>;
    },
  },
];

/** The stations online, one row each: what it is and who is using it. */
export function StationsTable({ stations, bare }: { stations: StationListing[]; bare?: boolean }) {
  return <DataTable columns={columns} data={stations} label="Stations online" bare={bare} rowTestId={(s) => `station-${s.name}`} />;
}

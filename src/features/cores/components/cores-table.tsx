import { tableFeatures, useTable, type ColumnDef } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { CoreRecord } from '../api/get-cores';
import { LIMIT_KEYS } from './core-meanings';

const features = tableFeatures({});

/** "16-bit turn angle → 16-bit output, 14 fraction bits, 16 iterations". */
export function modelSummary(c: CoreRecord): string {
  const m = c.modelConfig;
  const angle = m.angleFormat === 'turn' ? `${m.angleBits}-bit turn angle` : `${m.angleBits}-bit radian angle (${m.angleFrac} fraction bits)`;
  return `${angle} → ${m.outBits}-bit output, ${m.outFrac} fraction bits, ${m.iterations} iterations`;
}

const columns: ColumnDef<typeof features, CoreRecord>[] = [
  {
    id: 'name',
    header: 'Core',
    accessorFn: (c) => c.name,
    cell: ({ row }) => (
      <Link to={`/cores/${row.original.id}`} className="font-bold underline decoration-rule underline-offset-2 hover:decoration-signal">
        {row.original.name}
      </Link>
    ),
  },
  { id: 'slug', header: 'Slug', accessorFn: (c) => c.slug, cell: ({ getValue }) => <span className="font-mono">{String(getValue())}</span> },
  { id: 'model', header: 'Reference model', accessorFn: modelSummary },
  { id: 'link', header: 'Link', accessorFn: (c) => `${c.linkProfile.baud.toLocaleString('en-US')} bit/s, ${c.linkProfile.crc}` },
  {
    id: 'limits',
    header: 'Limits set',
    accessorFn: (c) => LIMIT_KEYS.filter((k) => c.limits[k] !== undefined).length,
    cell: ({ getValue }) => `${String(getValue())} of ${LIMIT_KEYS.length}`,
  },
  {
    id: 'baseline',
    header: 'Baseline',
    accessorFn: (c) => c.baselineSessionId,
    cell: ({ row }) =>
      row.original.baselineSessionId ? (
        <Link to={`/sessions/${row.original.baselineSessionId}`} className="underline">session #{row.original.baselineSessionId}</Link>
      ) : (
        <span className="text-ink-soft">none</span>
      ),
  },
];

/** Every core the team tests, by name. */
export function CoresTable({ cores }: { cores: CoreRecord[] }) {
  const table = useTable({ features, columns, data: cores });
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-panel">
      <table className="w-full text-sm">
        <thead className="border-b border-rule text-left text-xs uppercase tracking-wider text-ink-soft">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => (
                <th key={h.id} scope="col" className="px-3 py-2 font-bold">
                  <table.FlexRender header={h} />
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule/60 last:border-0">
              {row.getAllCells().map((cell) => (
                <td key={cell.id} className="px-3 py-2 align-top">
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

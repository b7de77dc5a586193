import { DataTable, type PlainColumn } from '../../../components/data-table';
import { Link } from 'react-router-dom';
import type { CoreRecord } from '../../../lib/resources/cores';
import { LIMIT_KEYS } from './core-meanings';

/** "16-bit turn angle → 16-bit output, 14 fraction bits, 16 iterations". */
export function modelSummary(c: CoreRecord): string {
  const m = c.modelConfig;
  if (!m) {
    const v = c.vectorConfig;
    return v ? `vectoring: ${v.inBits}-bit x/y → ${v.angleBits}-bit angle, ${v.magBits}-bit magnitude, ${v.iterations} iterations` : 'no model configuration';
  }
  const angle = m.angleFormat === 'turn' ? `${m.angleBits}-bit turn angle` : `${m.angleBits}-bit radian angle (${m.angleFrac} fraction bits)`;
  return `${angle} → ${m.outBits}-bit output, ${m.outFrac} fraction bits, ${m.iterations} iterations`;
}

const columns: PlainColumn<CoreRecord>[] = [
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
  return <DataTable columns={columns} data={cores} />;
}

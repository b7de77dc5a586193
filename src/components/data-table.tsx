import { tableFeatures, useTable, type ColumnDef, type RowData } from '@tanstack/react-table';

/** The feature set of the app's client-side tables: columns only, in the order given. */
export const plainFeatures = tableFeatures({});
export type PlainColumn<T extends RowData> = ColumnDef<typeof plainFeatures, T>;

interface DataTableProps<T extends RowData> {
  columns: PlainColumn<T>[];
  data: T[];
  label?: string;
  /** A test id per row, for the browser tests. */
  rowTestId?: (row: T) => string;
  /** Without the panel's border and background, inside a panel of its own. */
  bare?: boolean;
  align?: 'top' | 'middle';
}

/** A table of the product's look: one header row, one row per item, scrolling sideways when narrow. */
export function DataTable<T extends RowData>({ columns, data, label, rowTestId, bare = false, align = 'top' }: DataTableProps<T>) {
  const table = useTable({ features: plainFeatures, columns, data });
  return (
    <div className={bare ? 'overflow-x-auto' : 'overflow-x-auto rounded-lg border border-rule bg-panel'}>
      <table className="w-full text-sm" aria-label={label}>
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
            <tr key={row.id} data-testid={rowTestId?.(row.original as T)} className="border-b border-rule/60 last:border-0">
              {row.getAllCells().map((cell) => (
                <td key={cell.id} className={`px-3 py-2 ${align === 'top' ? 'align-top' : 'align-middle'}`}>
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

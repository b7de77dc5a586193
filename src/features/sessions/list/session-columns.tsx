// The Sessions list's columns. Sorting is the server's (by start time or id); everything else is
// shown as the server sent it.
import { createColumnHelper, rowPaginationFeature, rowSelectionFeature, rowSortingFeature, tableFeatures } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { shortDateTime } from '../components/session-facts';
import { RegressionBadge, VerdictBadge } from '../components/verdict-badges';
import { Sparkline } from './sparkline';

export const tableFeaturesUsed = tableFeatures({ rowSortingFeature, rowSelectionFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof tableFeaturesUsed, SessionRecord>();

/** How many sessions the compare page takes at once. */
export const MAX_COMPARE = 6;

const lsb = (v: number | undefined) => (typeof v === 'number' ? v.toFixed(3) : '—');
const muted = (text: string) => <span className="text-ink-soft">{text}</span>;

/** Columns; `limitOf` gives a core's max-|error| limit for the sparkline's dashed line. */
export function sessionColumns(limitOf: (coreId: number) => number | undefined) {
  return helper.columns([
    helper.display({
      id: 'pick',
      header: () => <span className="sr-only">Pick for comparison</span>,
      cell: ({ row }) => (
        <input
          type="checkbox"
          className="h-4 w-4 accent-ink"
          aria-label={`Pick session #${row.original.id} for comparison`}
          checked={row.getIsSelected()}
          disabled={!row.getCanSelect()}
          onChange={row.getToggleSelectedHandler()}
        />
      ),
    }),
    helper.accessor('id', {
      header: '#',
      sortDescFirst: true,
      cell: (c) => (
        <Link className="font-mono font-bold underline" to={`/sessions/${c.getValue()}`}>
          #{c.getValue()}
        </Link>
      ),
    }),
    helper.accessor('startedAt', { header: 'Started', sortDescFirst: true, cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{shortDateTime(c.getValue())}</span> }),
    helper.accessor((r) => r.core?.name ?? `core #${r.coreId}`, { id: 'core', header: 'Core', enableSorting: false }),
    helper.accessor((r) => r.build?.label ?? null, { id: 'build', header: 'Build', enableSorting: false, cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{c.getValue() ?? muted('—')}</span> }),
    helper.accessor((r) => r.board?.name ?? null, { id: 'board', header: 'Board', enableSorting: false, cell: (c) => c.getValue() ?? muted('—') }),
    helper.accessor((r) => r.operator?.name ?? null, { id: 'operator', header: 'Operator', enableSorting: false, cell: (c) => c.getValue() ?? muted('—') }),
    helper.accessor('sampleCount', { header: 'Samples', enableSorting: false, cell: (c) => <span className="font-mono">{c.getValue().toLocaleString('en-US')}</span> }),
    helper.accessor((r) => r.stats.overall?.maxAbsLsb, { id: 'maxErr', header: 'Max |err| LSB', enableSorting: false, cell: (c) => <span className="font-mono">{lsb(c.getValue())}</span> }),
    helper.accessor((r) => r.stats.overall?.rmsLsb, { id: 'rms', header: 'RMS LSB', enableSorting: false, cell: (c) => <span className="font-mono">{lsb(c.getValue())}</span> }),
    helper.accessor((r) => r.stats.mismatches?.count, {
      id: 'mismatches',
      header: 'Mismatches',
      enableSorting: false,
      cell: (c) => <span className={`font-mono ${c.getValue() ? 'font-bold text-fail' : ''}`}>{c.getValue()?.toLocaleString('en-US') ?? '—'}</span>,
    }),
    helper.accessor('passed', {
      header: 'Verdict',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="flex flex-wrap gap-1">
          <VerdictBadge passed={row.original.passed} />
          {row.original.regression && <RegressionBadge />}
        </span>
      ),
    }),
    helper.display({
      id: 'profile',
      header: 'Error vs angle',
      cell: ({ row }) => <Sparkline profile={row.original.profile} passed={row.original.passed} limitLsb={limitOf(row.original.coreId)} />,
    }),
  ]);
}

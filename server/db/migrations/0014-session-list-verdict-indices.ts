// The session list's filters by one column (core, build, board, operator) together with the
// verdict or the regression filter. With only the single-filter indices of 0012, a count of
// "core 4, passed" walked the index of `passed` (most rows pass) and read each row from the table
// to check its core: at 100,000 sessions over a second per call on SQLite. An index per pair,
// followed by the sort columns, lets the count read the index alone and the page walk it in order.
import type { MigrationModule } from '../migrator';

const BY = ['coreId', 'buildId', 'boardId', 'operatorId'];
const indexName = (columns: string[]) => `sessions_list_${columns.join('_')}`;
const INDICES = [
  ...BY.flatMap((c) => [
    [c, 'passed', 'startedAt', 'id'],
    [c, 'regression', 'startedAt', 'id'],
  ]),
  // The list sorted by id: SQLite walks its table in rowid order, reading every skipped row's
  // pages (each row carries its statistics); an index of the id alone is a few pages per thousand.
  ['id'],
];

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  for (const columns of INDICES) await q.addIndex('sessions', columns, { name: indexName(columns) });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  for (const columns of INDICES) await q.removeIndex('sessions', indexName(columns));
};

// Two things the compare view and the session list need at 100,000 sessions and more:
// - Each session keeps the compare view's error envelope (lowest and highest signed error per bin
//   of the code range), scored once at ingest, so comparing sessions reads it instead of scoring a
//   million samples again. Sessions stored before have none (null) and are scored when compared.
//   It lives in its own table so the sessions table (and the list reading it) is unchanged.
// - The list filters on one column and pages in (startedAt, id) order: an index per filter column
//   followed by the sort columns lets the database walk the page's rows in order and stop, where the
//   single-column indices made it sort every matching row first.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const FILTERED = ['coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression'];
const indexName = (columns: string[]) => `sessions_list_${columns.join('_')}`;
const LIST_INDICES = [['startedAt', 'id'], ...FILTERED.map((c) => [c, 'startedAt', 'id'])];

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('session_envelopes', {
    sessionId: { type: DataTypes.INTEGER, primaryKey: true, allowNull: false, references: { model: 'sessions', key: 'id' }, onDelete: 'CASCADE' },
    bounds: { type: DataTypes.JSON, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  for (const columns of LIST_INDICES) await q.addIndex('sessions', columns, { name: indexName(columns) });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  for (const columns of LIST_INDICES) await q.removeIndex('sessions', indexName(columns));
  await q.dropTable('session_envelopes');
};

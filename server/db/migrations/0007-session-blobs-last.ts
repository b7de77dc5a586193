// SQLite stores a row's columns in order, and a column after a large BLOB can only be read by
// walking the BLOB's overflow pages. The sessions table had its samples (up to tens of MiB) in the
// middle, before notes, tags, the time stamps and the profile, so the session list — and any scan
// filtering on tags — read every session's samples. This rebuilds the table with the BLOBs last
// (SQLite's documented twelve-step table change); other databases keep large values out of line
// and need nothing.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const ref = (model: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({ type: DataTypes.INTEGER, allowNull, references: { model, key: 'id' }, onDelete });
const COLUMNS = {
  id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
  coreId: ref('cores', false, 'CASCADE'),
  buildId: ref('builds', true, 'SET NULL'),
  boardId: ref('boards', true, 'SET NULL'),
  operatorId: ref('users', true, 'SET NULL'),
  startedAt: { type: DataTypes.DATE, allowNull: false },
  endedAt: { type: DataTypes.DATE, allowNull: true },
  plan: { type: DataTypes.JSON, allowNull: false },
  transport: { type: DataTypes.JSON, allowNull: false },
  deviceInfo: { type: DataTypes.JSON, allowNull: true },
  stats: { type: DataTypes.JSON, allowNull: false },
  verdict: { type: DataTypes.JSON, allowNull: false },
  profile: { type: DataTypes.JSON, allowNull: true },
  passed: { type: DataTypes.BOOLEAN, allowNull: false },
  regression: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
  sampleCount: { type: DataTypes.INTEGER, allowNull: false },
  notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
  tags: { type: DataTypes.JSON, allowNull: false },
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
  samples: { type: DataTypes.BLOB, allowNull: false },
  archive: { type: DataTypes.BLOB, allowNull: true },
};
const INDEXED = ['coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression', 'startedAt'];

export const up: MigrationModule['up'] = async ({ queryInterface: q, sequelize }) => {
  if (sequelize.getDialect() !== 'sqlite') return;
  const names = Object.keys(COLUMNS).map((c) => `"${c}"`).join(', ');
  // Foreign keys off while the table is swapped, or dropping it would cascade into comments.
  // Outside a transaction, every statement here runs on the one default connection.
  await sequelize.query('PRAGMA foreign_keys = OFF');
  try {
    await sequelize.query('BEGIN IMMEDIATE');
    try {
      await q.createTable('sessions_reordered', COLUMNS);
      await sequelize.query(`INSERT INTO sessions_reordered (${names}) SELECT ${names} FROM sessions`);
      await sequelize.query('DROP TABLE sessions');
      await sequelize.query('ALTER TABLE sessions_reordered RENAME TO sessions');
      for (const column of INDEXED) await q.addIndex('sessions', [column]);
      const [broken] = await sequelize.query('PRAGMA foreign_key_check');
      if ((broken as unknown[]).length) throw new Error(`foreign keys broken by the sessions rebuild: ${JSON.stringify(broken).slice(0, 300)}`);
      await sequelize.query('COMMIT');
    } catch (err) {
      await sequelize.query('ROLLBACK');
      throw err;
    }
  } finally {
    await sequelize.query('PRAGMA foreign_keys = ON');
  }
};

// Column order carries no meaning to undo.
export const down: MigrationModule['down'] = async () => {};

// Vectoring cores (issue #20): a core has a mode, `rotation` (every core so far) or `vectoring`.
// A rotation core keeps its configuration in `modelConfig`; a vectoring core's is `vectorConfig`
// (shared/vectoring) and its `modelConfig` is NULL, so nothing can read it as a rotation core.
// SQLite cannot drop a NOT NULL constraint in place: the cores table is rebuilt (SQLite's
// documented twelve-step table change, as 0007 does for sessions); PostgreSQL alters the columns.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const KEPT = ['id', 'name', 'slug', 'linkProfile', 'modelConfig', 'limits', 'baselineSessionId', 'createdAt', 'updatedAt'];
const columns = (withMode: boolean) => ({
  id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
  name: { type: DataTypes.STRING(120), allowNull: false },
  slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
  ...(withMode ? { mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'rotation' } } : {}),
  linkProfile: { type: DataTypes.JSON, allowNull: false },
  modelConfig: { type: DataTypes.JSON, allowNull: withMode },
  ...(withMode ? { vectorConfig: { type: DataTypes.JSON, allowNull: true } } : {}),
  limits: { type: DataTypes.JSON, allowNull: false },
  baselineSessionId: { type: DataTypes.INTEGER, allowNull: true },
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
});

/** Rebuild SQLite's cores table with or without the mode columns, keeping every row and id. */
async function rebuildSqlite({ queryInterface: q, sequelize }: Parameters<MigrationModule['up']>[0], withMode: boolean) {
  const names = KEPT.map((c) => `"${c}"`).join(', ');
  // Foreign keys off while the table is swapped, or dropping it would cascade into builds and sessions.
  await sequelize.query('PRAGMA foreign_keys = OFF');
  try {
    await sequelize.query('BEGIN IMMEDIATE');
    try {
      await q.createTable('cores_rebuilt', columns(withMode));
      await sequelize.query(`INSERT INTO cores_rebuilt (${names}) SELECT ${names} FROM cores`);
      await sequelize.query('DROP TABLE cores');
      await sequelize.query('ALTER TABLE cores_rebuilt RENAME TO cores');
      const [broken] = await sequelize.query('PRAGMA foreign_key_check');
      if ((broken as unknown[]).length) throw new Error(`foreign keys broken by the cores rebuild: ${JSON.stringify(broken).slice(0, 300)}`);
      await sequelize.query('COMMIT');
    } catch (err) {
      await sequelize.query('ROLLBACK');
      throw err;
    }
  } finally {
    await sequelize.query('PRAGMA foreign_keys = ON');
  }
}

export const up: MigrationModule['up'] = async (context) => {
  const { queryInterface: q, sequelize } = context;
  if (sequelize.getDialect() === 'sqlite') return rebuildSqlite(context, true);
  await q.addColumn('cores', 'mode', { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'rotation' });
  await q.addColumn('cores', 'vectorConfig', { type: DataTypes.JSON, allowNull: true });
  await q.changeColumn('cores', 'modelConfig', { type: DataTypes.JSON, allowNull: true });
};

/** Refused while vectoring cores exist: a rotation-only database has nowhere to keep them. */
export const down: MigrationModule['down'] = async (context) => {
  const { queryInterface: q, sequelize } = context;
  const [rows] = await sequelize.query(`SELECT COUNT(*) AS n FROM cores WHERE mode <> 'rotation'`);
  const n = Number((rows as Array<{ n: number | string }>)[0]?.n ?? 0);
  if (n > 0) throw new Error(`${n} vectoring core(s) exist: delete them before undoing this migration`);
  if (sequelize.getDialect() === 'sqlite') return rebuildSqlite(context, false);
  await q.changeColumn('cores', 'modelConfig', { type: DataTypes.JSON, allowNull: false });
  await q.removeColumn('cores', 'vectorConfig');
  await q.removeColumn('cores', 'mode');
};

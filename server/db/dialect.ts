// SQL that differs between SQLite and PostgreSQL, chosen per dialect here and nowhere else.
import { literal, QueryTypes, type Sequelize } from 'sequelize';

export type Dialect = 'sqlite' | 'postgres';

export function dialectOf(db: Sequelize): Dialect {
  const d = db.getDialect();
  if (d === 'sqlite' || d === 'postgres') return d;
  throw new Error(`unsupported database dialect: ${d}`);
}

/**
 * A WHERE condition: the JSON array column `column` (quoted, e.g. `"BenchSession"."tags"`)
 * holds the string `value`. SQLite walks the array with json_each; PostgreSQL with
 * json_array_elements_text (the column is `json`, not `jsonb`, so no containment operator).
 */
export function jsonArrayContains(db: Sequelize, column: string, value: string) {
  const v = db.escape(value);
  return dialectOf(db) === 'postgres'
    ? literal(`EXISTS (SELECT 1 FROM json_array_elements_text(${column}) AS tag WHERE tag = ${v})`)
    : literal(`EXISTS (SELECT 1 FROM json_each(${column}) WHERE json_each.value = ${v})`);
}

/**
 * Run `fn` (migrate and seed at start-up) while holding a database-wide lock, so two server
 * instances started at once on one PostgreSQL do not both apply a migration or both seed the
 * demo. The lock is a transaction-scoped advisory lock on a connection of its own, released when
 * `fn` is done. SQLite serves one instance per file and needs none.
 */
export async function withStartupLock<T>(db: Sequelize, fn: () => Promise<T>): Promise<T> {
  if (dialectOf(db) !== 'postgres') return fn();
  return db.transaction(async (transaction) => {
    await db.query(`SELECT pg_advisory_xact_lock(${STARTUP_LOCK_KEY})`, { transaction });
    return fn();
  });
}

/** Any fixed 64-bit number, the same in every instance: "anglebench start-up". */
const STARTUP_LOCK_KEY = 0x616e676c65;

/** The database server's own version, e.g. `3.45.1` or `15.18 (Debian 15.18-0+deb12u1)`. */
export async function serverVersion(db: Sequelize): Promise<string> {
  const sql = dialectOf(db) === 'postgres' ? 'SELECT version() AS v' : 'SELECT sqlite_version() AS v';
  const [row] = (await db.query(sql, { type: QueryTypes.SELECT })) as Array<{ v: string }>;
  return dialectOf(db) === 'postgres' ? row.v.replace(/^PostgreSQL /, '').replace(/ on .*$/, '') : row.v;
}

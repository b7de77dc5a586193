// The bare database drivers the server-side benchmarks set their figures beside: sqlite3 on a
// file, or pg on a PostgreSQL database, with nothing of Sequelize or the app between.
import pg from 'pg';
import sqlite3 from 'sqlite3';

export type BenchDialect = 'sqlite' | 'postgres';
export const BENCH_DIALECTS: BenchDialect[] = ['sqlite', 'postgres'];

export interface BareDriver {
  /** `sqlite3` or `pg`, for the ratio's wording. */
  name: string;
  /** Runs `sql` with positional parameters (`?` for sqlite3, `$1…` for pg); resolves to the rows. */
  query(sql: string, params?: unknown[]): Promise<unknown[]>;
  close(): Promise<void>;
}

/** A bare connection to the database of `databaseUrl` (an app DATABASE_URL). */
export async function bareDriver(databaseUrl: string, options: { readOnly?: boolean } = {}): Promise<BareDriver> {
  if (databaseUrl.startsWith('sqlite:')) {
    const file = databaseUrl.slice('sqlite:'.length);
    const mode = options.readOnly ? sqlite3.OPEN_READONLY : sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE;
    const db = await new Promise<sqlite3.Database>((resolve, reject) => {
      const d = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(d)));
    });
    return {
      name: 'sqlite3',
      query: (sql, params = []) => new Promise((resolve, reject) => db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows)))),
      close: () => new Promise((resolve) => db.close(() => resolve())),
    };
  }
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  return {
    name: 'pg',
    query: async (sql, params = []) => (await client.query(sql, params)).rows,
    close: () => client.end(),
  };
}

// One statement on a connection of its own, for the few places that talk to PostgreSQL outside
// Sequelize (backups and restores, the tests' throwaway databases).
import pg from 'pg';

/** The rows of `sql` run on its own connection to the PostgreSQL database at `url`. */
export async function pgQuery<T extends pg.QueryResultRow>(url: string, sql: string): Promise<T[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query<T>(sql)).rows;
  } finally {
    await client.end();
  }
}

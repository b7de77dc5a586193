// What server/db/dialect.ts chooses per database, checked on the database the test runs on
// (SQLite, or PostgreSQL under `npm run test:pg`): the tag filter matches whole tags only, blobs
// are stored as the database's binary type, and the start-up lock lets one caller in at a time.
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../../server/db/connection';
import { dialectOf, jsonArrayContains, serverVersion, withStartupLock } from '../../../server/db/dialect';
import { migrate } from '../../../server/db/migrator';
import { tempDatabase } from '../../support/temp-db';

const tmp = await tempDatabase();
let db: Sequelize;
let other: Sequelize;

beforeAll(async () => {
  db = openDatabase(tmp.url);
  await migrate(db);
  other = openDatabase(tmp.url);
  await db.query('CREATE TABLE tagged (id INTEGER PRIMARY KEY, tags JSON NOT NULL)');
  await db.query(`INSERT INTO tagged (id, tags) VALUES (1, '["tone","night run"]'), (2, '["tones"]'), (3, '[]'), (4, '["it''s"]')`);
});
afterAll(async () => {
  await other.close();
  await db.close();
  await tmp.cleanup();
});

const tagged = async (tag: string) => {
  const condition = jsonArrayContains(db, 'tagged.tags', tag);
  const rows = await db.query<{ id: number }>(`SELECT id FROM tagged WHERE ${condition.val as string} ORDER BY id`, { type: QueryTypes.SELECT });
  return rows.map((r) => Number(r.id));
};

describe(`server/db/dialect.ts on ${tmp.dialect}`, () => {
  it('names the dialect and the server version', async () => {
    expect(dialectOf(db)).toBe(tmp.dialect);
    expect(await serverVersion(db)).toMatch(/^\d+\.\d+/);
  });

  it('filters a JSON array column by one whole tag, quotes and spaces included', async () => {
    expect(await tagged('tone')).toEqual([1]);
    expect(await tagged('tones')).toEqual([2]);
    expect(await tagged('night run')).toEqual([1]);
    expect(await tagged("it's")).toEqual([4]);
    expect(await tagged('ton')).toEqual([]);
  });

  it('keeps samples and archives in the binary column type (bytea on PostgreSQL)', async () => {
    const types =
      tmp.dialect === 'postgres'
        ? await db.query<{ name: string; type: string }>(
            "SELECT column_name AS name, data_type AS type FROM information_schema.columns WHERE table_name = 'sessions' AND column_name IN ('samples', 'archive') ORDER BY column_name",
            { type: QueryTypes.SELECT },
          )
        : await db.query<{ name: string; type: string }>("SELECT name, type FROM pragma_table_info('sessions') WHERE name IN ('samples', 'archive') ORDER BY name", { type: QueryTypes.SELECT });
    expect(types).toEqual([
      { name: 'archive', type: tmp.dialect === 'postgres' ? 'bytea' : 'BLOB' },
      { name: 'samples', type: tmp.dialect === 'postgres' ? 'bytea' : 'BLOB' },
    ]);
  });

  it.runIf(tmp.dialect === 'postgres')('lets one instance at a time through the start-up lock', async () => {
    const order: string[] = [];
    let releaseFirst!: () => void;
    const firstHolds = new Promise<void>((r) => (releaseFirst = r));
    let firstIn!: () => void;
    const firstEntered = new Promise<void>((r) => (firstIn = r));
    const first = withStartupLock(db, async () => {
      order.push('first in');
      firstIn();
      await firstHolds;
      order.push('first out');
    });
    await firstEntered;
    const second = withStartupLock(other, async () => void order.push('second in'));
    // Wait until PostgreSQL shows the second queued on the lock; it must not have run.
    const queued = async () =>
      Number((await db.query<{ n: string }>("SELECT count(*) AS n FROM pg_locks WHERE locktype = 'advisory' AND NOT granted", { type: QueryTypes.SELECT }))[0].n);
    while ((await queued()) === 0);
    expect(order).toEqual(['first in']);
    releaseFirst();
    await Promise.all([first, second]);
    expect(order).toEqual(['first in', 'first out', 'second in']);
  });
});

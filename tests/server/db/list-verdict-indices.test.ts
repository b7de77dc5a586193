import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../../server/db/connection';
import { createMigrator } from '../../../server/db/migrator';
import { tempDatabase } from '../../support/temp-db';

// Migration 0014 adds the session list's indices of one column with the verdict or the regression
// filter, and of the id; undoing it removes exactly those. On SQLite and, under `npm run test:pg`, PostgreSQL.
const tmp = await tempDatabase();
let db: Sequelize;
beforeAll(async () => {
  db = openDatabase(tmp.url);
  await createMigrator(db).up({ to: '0014-session-list-verdict-indices' });
});
afterAll(async () => {
  await db.close();
  await tmp.cleanup();
});

const NEW = ['coreId', 'buildId', 'boardId', 'operatorId'].flatMap((c) => [`sessions_list_${c}_passed_startedAt_id`, `sessions_list_${c}_regression_startedAt_id`]).concat('sessions_list_id');

async function indexNames(): Promise<string[]> {
  const rows = (await db.getQueryInterface().showIndex('sessions')) as Array<{ name: string }>;
  return rows.map((r) => r.name);
}

describe('migration 0014 (session list verdict indices)', () => {
  it('adds an index per filter column with the verdict and with the regression filter, and one of the id', async () => {
    const names = await indexNames();
    for (const name of NEW) expect(names).toContain(name);
  });

  it('takes them away again when undone, leaving the indices of 0012', async () => {
    await createMigrator(db).down({ to: '0014-session-list-verdict-indices' });
    const names = await indexNames();
    for (const name of NEW) expect(names).not.toContain(name);
    expect(names).toContain('sessions_list_coreId_startedAt_id');
    await createMigrator(db).up();
    expect(await indexNames()).toEqual(expect.arrayContaining(NEW));
  });
});

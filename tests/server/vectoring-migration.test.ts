import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/connection';
import { createMigrator } from '../../server/db/migrator';
import { tempDatabase } from '../support/temp-db';

// Migration 0015 gives cores a mode and a vectoring configuration; on SQLite it rebuilds the cores
// table (to let modelConfig be NULL), which must keep every core and every row pointing at one.
const tmp = await tempDatabase();
let db: Sequelize;
const rows = async (sql: string) => (await db.query(sql))[0] as Array<Record<string, unknown>>;
beforeAll(async () => {
  db = openDatabase(tmp.url);
  await createMigrator(db).up({ to: '0012-session-envelope-and-list-indices' });
  const now = new Date().toISOString();
  await db.query(`INSERT INTO cores (name, slug, "linkProfile", "modelConfig", limits, "createdAt", "updatedAt") VALUES ('Old core', 'old-core', '{}', '{"angleBits":14}', '{}', '${now}', '${now}')`);
  await db.query(`INSERT INTO builds ("coreId", label, "sourceRevision", "toolVersion", "clockMHz", notes, "createdAt", "updatedAt") VALUES (1, 'b1', 'abc', 't', 100, '', '${now}', '${now}')`);
});
afterAll(async () => {
  await db.close();
  await tmp.cleanup();
});

describe('migration 0015 (vectoring cores)', () => {
  it('keeps every core as a rotation core with its configuration, and the rows that point at it', async () => {
    await createMigrator(db).up();
    const [core] = await rows('SELECT id, slug, mode, "vectorConfig", "modelConfig" FROM cores');
    expect(core).toMatchObject({ id: 1, slug: 'old-core', mode: 'rotation', vectorConfig: null });
    expect(typeof core.modelConfig === 'string' ? JSON.parse(core.modelConfig) : core.modelConfig).toEqual({ angleBits: 14 });
    expect(await rows('SELECT label FROM builds')).toEqual([{ label: 'b1' }]);
    // A vectoring core needs no rotation configuration now.
    const now = new Date().toISOString();
    await db.query(`INSERT INTO cores (name, slug, mode, "linkProfile", "modelConfig", "vectorConfig", limits, "createdAt", "updatedAt") VALUES ('Vec', 'vec', 'vectoring', '{}', NULL, '{}', '{}', '${now}', '${now}')`);
    // The builds' foreign key still points at cores: deleting the core takes its build along.
    await db.query('DELETE FROM cores WHERE id = 1');
    expect(await rows('SELECT label FROM builds')).toEqual([]);
  });

  it('is undone only when no vectoring core would be lost', async () => {
    await expect(createMigrator(db).down()).rejects.toThrow(/1 vectoring core\(s\) exist/);
    await db.query(`DELETE FROM cores WHERE mode = 'vectoring'`);
    await createMigrator(db).down();
    const sql = db.getDialect() === 'sqlite' ? "SELECT name FROM pragma_table_info('cores')" : "SELECT column_name AS name FROM information_schema.columns WHERE table_name = 'cores'";
    const columns = (await rows(sql)).map((c) => c.name);
    expect(columns).toContain('modelConfig');
    expect(columns).not.toContain('mode');
    expect(columns).not.toContain('vectorConfig');
  });
});

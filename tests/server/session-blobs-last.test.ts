import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/connection';
import { createMigrator } from '../../server/db/migrator';
import { BenchSession, Comment, initModels, User } from '../../server/db/models';
import { seedIfEmpty } from '../../server/db/seed';
import * as sessionConditions from '../../server/db/migrations/0010-session-conditions';
import * as vectoringCores from '../../server/db/migrations/0015-vectoring-cores';
import { tempDatabase } from '../support/temp-db';

// Migration 0007 rebuilds `sessions` with its BLOBs last, so reading the other columns never
// walks a session's samples. It runs over a database that already holds the demo.
const tmp = await tempDatabase({ dialect: 'sqlite' });
let db: Sequelize;
beforeAll(async () => {
  db = openDatabase(tmp.url);
  await createMigrator(db).up({ to: '0006-invitation-name' });
  initModels(db);
  // Today's demo also records the conditions its thermal sweep ran under, in a table of a later
  // migration: lend the seed that table, then take it away so the migrator creates it in turn.
  const context = { queryInterface: db.getQueryInterface(), sequelize: db };
  // Likewise the cores' mode columns: the demo's vectoring core (and its sessions, by cascade) goes with them.
  await sessionConditions.up(context);
  await vectoringCores.up(context);
  await seedIfEmpty(db, 'demo-password', 4);
  await db.query("DELETE FROM cores WHERE mode = 'vectoring'");
  await vectoringCores.down(context);
  await sessionConditions.down(context);
});
afterAll(async () => {
  await db.close();
  await tmp.cleanup();
});

describe('migration 0007 (session BLOBs last)', () => {
  it('keeps every session and comment as it was, puts samples and archive last and keeps the foreign keys working', async () => {
    const author = await User.findOne();
    const session = await BenchSession.findOne({ order: [['id', 'ASC']] });
    await Comment.create({ sessionId: session!.id, authorId: author!.id, body: 'kept through the rebuild' });
    const before = JSON.stringify((await BenchSession.findAll({ order: [['id', 'ASC']] })).map((s) => s.toJSON()));

    await createMigrator(db).up();

    expect(JSON.stringify((await BenchSession.findAll({ order: [['id', 'ASC']] })).map((s) => s.toJSON()))).toBe(before);
    const [columns] = (await db.query("SELECT name FROM pragma_table_info('sessions')")) as [Array<{ name: string }>, unknown];
    expect(columns.slice(-2).map((c) => c.name)).toEqual(['samples', 'archive']);
    const [indexes] = (await db.query("SELECT name FROM sqlite_master WHERE type = 'index' AND tbl_name = 'sessions'")) as [Array<{ name: string }>, unknown];
    expect(indexes.map((i) => i.name)).toContain('sessions_started_at');
    expect((await db.query('PRAGMA integrity_check'))[0]).toEqual([{ integrity_check: 'ok' }]);
    expect(await Comment.count()).toBe(1);
    // The comment's foreign key now points at the rebuilt table: deleting the session takes it along.
    await session!.destroy();
    expect(await Comment.count()).toBe(0);
  });
});

import request from 'supertest';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { openDatabase } from '../../server/db/connection';
import { migrate } from '../../server/db/migrator';
import { tempDatabase } from '../support/temp-db';

const tmp = await tempDatabase();
const config = loadConfig({ NODE_ENV: 'test', DATABASE_URL: tmp.url, SESSION_SECRET: 'x'.repeat(32) });
let db: Sequelize;

beforeAll(async () => {
  db = openDatabase(config.databaseUrl);
  await migrate(db);
});
afterAll(async () => {
  await db.close();
  await tmp.cleanup();
});

describe('GET /api/health', () => {
  it('reports the version and a reachable database', async () => {
    const res = await request(createApp({ config, db })).get('/api/health').expect(200);
    expect(res.body.status).toBe('ok');
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/);
    expect(res.body.database).toMatchObject({ status: 'ok', dialect: tmp.dialect });
    // The server's own version: SQLite's library (3.x) or PostgreSQL's (e.g. 15.18 (Debian …)).
    expect(res.body.database.serverVersion).toMatch(tmp.dialect === 'sqlite' ? /^3\.\d+\.\d+$/ : /^\d+\.\d+/);
    expect(typeof res.body.database.migrations).toBe('number');
  });

  it('reports a degraded service with 503 when the database is gone', async () => {
    const other = openDatabase(tmp.url);
    await other.close();
    const res = await request(createApp({ config, db: other })).get('/api/health').expect(503);
    expect(res.body.status).toBe('degraded');
    expect(res.body.database.status).toBe('down');
  });
});

describe.runIf(tmp.dialect === 'sqlite')('the SQLite connection', () => {
  it('runs in WAL mode with a busy timeout', async () => {
    const [mode] = (await db.query('PRAGMA journal_mode', { type: 'SELECT' })) as Array<{ journal_mode: string }>;
    expect(mode.journal_mode).toBe('wal');
    const [busy] = (await db.query('PRAGMA busy_timeout', { type: 'SELECT' })) as Array<Record<string, number>>;
    expect(Object.values(busy)[0]).toBe(5000);
  });
});

describe('errors', () => {
  it('answers an unknown API route with a JSON 404', async () => {
    const res = await request(createApp({ config, db })).get('/api/no-such-thing').expect(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: 'No API route for GET /no-such-thing' } });
  });

  it('answers malformed JSON with a 400 and no stack trace', async () => {
    const res = await request(createApp({ config, db }))
      .post('/api/health')
      .set('content-type', 'application/json')
      .send('{"broken": ')
      .expect(400);
    expect(res.body.error.code).toBe('bad_json');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts/);
  });

  it('answers a body over the limit with 413', async () => {
    const res = await request(createApp({ config, db }))
      .post('/api/health')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ pad: 'x'.repeat(2 * 1024 * 1024) }))
      .expect(413);
    expect(res.body.error.code).toBe('too_large');
  });
});

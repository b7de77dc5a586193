// The sign-in limiter's store on the database: counts shared by whoever uses the table, exact
// under concurrent increments, and a window that has ended starts again.
import type { Options } from 'express-rate-limit';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SignInAttemptStore } from '../../../server/auth/sign-in-attempt-store';
import { openDatabase } from '../../../server/db/connection';
import { migrate } from '../../../server/db/migrator';
import { tempDatabase } from '../../support/temp-db';

const tmp = await tempDatabase();
let db: Sequelize;
let other: Sequelize;
const WINDOW_MS = 15 * 60 * 1000;
const storeOn = (d: Sequelize) => {
  const s = new SignInAttemptStore(d);
  s.init({ windowMs: WINDOW_MS } as Options);
  return s;
};

beforeAll(async () => {
  db = openDatabase(tmp.url);
  await migrate(db);
  // A second connection pool on the same database stands for a second server instance.
  other = openDatabase(tmp.url);
});
afterAll(async () => {
  await other.close();
  await db.close();
  await tmp.cleanup();
});

describe('SignInAttemptStore', () => {
  it('counts every hit once when two instances count the same client at once', async () => {
    const a = storeOn(db);
    const b = storeOn(other);
    const results = await Promise.all(Array.from({ length: 30 }, (_, i) => (i % 2 ? a : b).increment('10.0.0.1')));
    // Each increment saw its own count: 1…30, none twice.
    expect(results.map((r) => r.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 30 }, (_, i) => i + 1));
    expect((await b.get('10.0.0.1'))?.totalHits).toBe(30);
    const resetTime = results[0].resetTime!.getTime();
    expect(Math.abs(resetTime - (Date.now() + WINDOW_MS))).toBeLessThan(60_000);
  });

  it('takes a hit back on decrement, forgets a client on resetKey, and keeps clients apart', async () => {
    const a = storeOn(db);
    await a.increment('10.0.0.2');
    await a.increment('10.0.0.2');
    await a.decrement('10.0.0.2');
    expect((await a.get('10.0.0.2'))?.totalHits).toBe(1);
    expect((await a.get('10.0.0.3'))).toBeUndefined();
    await a.resetKey('10.0.0.2');
    expect(await a.get('10.0.0.2')).toBeUndefined();
  });

  it('starts a client again at one hit once its window has ended', async () => {
    const a = storeOn(db);
    for (let i = 0; i < 5; i++) await a.increment('10.0.0.4');
    // The window ended a second ago (set in the table rather than waited for).
    await db.query('UPDATE sign_in_attempts SET "resetMs" = :past WHERE client = :client', { replacements: { past: Date.now() - 1000, client: 'sign-in:10.0.0.4' } });
    expect(await a.get('10.0.0.4')).toBeUndefined();
    expect((await a.increment('10.0.0.4')).totalHits).toBe(1);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp, TEST_PASSWORD, type TestApp } from '../support/test-app';

// An app of its own, so the failures counted here are exactly this test's, in any order.
let t: TestApp;
beforeAll(async () => {
  t = await testApp({ loginLimit: { windowMs: 60_000, max: 3 } });
});
afterAll(() => t.close());

describe('the sign-in rate limit', () => {
  it('answers 429 after too many failed sign-ins from one address, even with the right password then', async () => {
    const visitor = await t.visitor();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      statuses.push((await visitor.post('/api/auth/login').send({ email: 'admin@lab.test', password: 'guess-' + i })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    const res = await visitor.post('/api/auth/login').send({ email: 'admin@lab.test', password: TEST_PASSWORD }).expect(429);
    expect(res.body.error.code).toBe('too_many_attempts');
  });
});

import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/auth/passwords';
import { loadConfig } from '../../server/config';
import { openDatabase } from '../../server/db/connection';
import { migrate } from '../../server/db/migrator';
import { initModels, User, type Role } from '../../server/db/models';
import { startMailCatcher } from '../../server/mail/catcher';
import { createSmtpMailer } from '../../server/mail/mailer';
import type { LoginLimit } from '../../server/routes/auth';
import type { StationOptions } from '../../server/stations';
import { tempDatabase } from './temp-db';

export const TEST_PASSWORD = 'test-password-1';
export type Agent = ReturnType<typeof request.agent>;

/**
 * The app over a fresh migrated database, with the local mail catcher as its mailer, bitstreams
 * in the temporary folder, a cheap bcrypt cost and one user per role (password TEST_PASSWORD).
 */
export async function testApp(options: { uploadLimitBytes?: number; loginLimit?: LoginLimit; env?: Record<string, string>; stations?: StationOptions; dialect?: 'sqlite' | 'postgres' } = {}) {
  const tmp = await tempDatabase({ dialect: options.dialect });
  const config = loadConfig(
    { NODE_ENV: 'test', DATABASE_URL: tmp.url, SESSION_SECRET: 'x'.repeat(32), UPLOAD_LIMIT_BYTES: String(options.uploadLimitBytes ?? 64 * 1024 * 1024), ...options.env },
    path.join(tmp.dir, 'session-secret'),
  );
  const db = openDatabase(config.databaseUrl);
  await migrate(db);
  initModels(db);
  const catcher = await startMailCatcher(db);
  const mailer = createSmtpMailer(catcher.url);
  const uploadDir = path.join(tmp.dir, 'uploads');
  const app = createApp({ config, db, mailer, uploadDir, bcryptCost: 4, loginLimit: options.loginLimit, stations: options.stations });

  const passwordHash = await hashPassword(TEST_PASSWORD, 4);
  const users = {} as Record<Role, User>;
  for (const role of ['reviewer', 'engineer', 'admin'] as const) {
    users[role] = await User.create({ email: `${role}@lab.test`, name: `Test ${role}`, role, passwordHash });
  }

  /** A cookie-keeping client holding a CSRF token, not signed in. */
  const visitor = async (): Promise<Agent> => {
    const agent = request.agent(app);
    const res = await agent.get('/api/auth/csrf').expect(200);
    agent.set('x-csrf-token', res.body.token);
    return agent;
  };

  /** A client signed in as `email`, holding the CSRF token of its new session. */
  const signIn = async (email: string, password = TEST_PASSWORD): Promise<Agent> => {
    const agent = await visitor();
    const res = await agent.post('/api/auth/login').send({ email, password }).expect(200);
    agent.set('x-csrf-token', res.body.csrfToken);
    return agent;
  };

  return {
    app,
    db,
    config,
    mailer,
    uploadDir,
    users,
    visitor,
    signIn,
    signInAs: (role: Role) => signIn(users[role].email),
    close: async () => {
      mailer.close();
      await catcher.close();
      await db.close();
      await tmp.cleanup();
    },
  };
}

export type TestApp = Awaited<ReturnType<typeof testApp>>;

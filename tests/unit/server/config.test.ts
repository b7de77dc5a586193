import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../server/config';

const secretFile = () => path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-cfg-')), 'session-secret');

describe('loadConfig', () => {
  it('fills the documented defaults', () => {
    const c = loadConfig({}, secretFile());
    expect(c.port).toBe(3000);
    expect(c.mockWsPort).toBe(5175);
    expect(c.nodeEnv).toBe('development');
    expect(c.databaseUrl).toMatch(/^sqlite:.*data\/anglebench\.sqlite$/);
  });

  it('accepts in-memory SQLite and PostgreSQL URLs', () => {
    expect(loadConfig({ DATABASE_URL: 'sqlite::memory:' }, secretFile()).databaseUrl).toBe('sqlite::memory:');
    expect(loadConfig({ DATABASE_URL: 'postgres://u:p@localhost/ab' }, secretFile()).databaseUrl).toMatch(/^postgres:/);
  });

  it('names every bad variable in one readable error', () => {
    try {
      loadConfig({ PORT: 'eighty', DATABASE_URL: 'mysql://x', SMTP_URL: 'not a url' }, secretFile());
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ConfigError);
      const message = (err as Error).message;
      expect(message).toContain('PORT');
      expect(message).toContain('DATABASE_URL');
      expect(message).toContain('SMTP_URL');
    }
  });

  it('generates a session secret once and keeps it', () => {
    const file = secretFile();
    const first = loadConfig({}, file).sessionSecret;
    expect(first).toMatch(/^[0-9a-f]{64}$/);
    expect(loadConfig({}, file).sessionSecret).toBe(first);
    expect(loadConfig({ SESSION_SECRET: 's'.repeat(20) }, file).sessionSecret).toBe('s'.repeat(20));
  });
});

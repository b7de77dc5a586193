import fs from 'node:fs';
import path from 'node:path';
import { Sequelize } from 'sequelize';

import sqlite3 from 'sqlite3';

const PRAGMAS = 'PRAGMA busy_timeout = 5000; PRAGMA foreign_keys = ON;';

/**
 * sqlite3 with our pragmas applied to every connection before Sequelize sees it. Sequelize's
 * SQLite dialect opens a connection per transaction and runs no connect hooks, so the pragmas
 * must ride on the driver itself: WAL (readers never block the writer), a busy timeout (a second
 * writer waits instead of failing) and enforced foreign keys.
 */
class TunedDatabase extends sqlite3.Database {
  constructor(filename: string, mode: number, callback: (err: Error | null) => void) {
    super(filename, mode, (err) => {
      if (err) return callback(err);
      const wal = filename === ':memory:' || filename === '' ? '' : 'PRAGMA journal_mode = WAL; ';
      this.exec(wal + PRAGMAS, callback);
    });
  }
}

const tunedSqlite3 = Object.assign(Object.create(sqlite3) as typeof sqlite3, { Database: TunedDatabase });

/** Open the database named by DATABASE_URL (SQLite file, in-memory SQLite or PostgreSQL). */
export function openDatabase(databaseUrl: string, logging: false | ((sql: string) => void) = false): Sequelize {
  if (!databaseUrl.startsWith('sqlite:')) return new Sequelize(databaseUrl, { logging });
  const storage = databaseUrl === 'sqlite::memory:' ? ':memory:' : databaseUrl.slice('sqlite:'.length);
  if (storage !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(storage)), { recursive: true });
  return new Sequelize({ dialect: 'sqlite', dialectModule: tunedSqlite3, storage, logging });
}

export type DatabaseStatus = { status: 'ok' | 'down'; dialect: string; message?: string };

/** A cheap round trip to the database, for the health report. */
export async function checkDatabase(db: Sequelize): Promise<DatabaseStatus> {
  try {
    await db.query('SELECT 1');
    return { status: 'ok', dialect: db.getDialect() };
  } catch (err) {
    return { status: 'down', dialect: db.getDialect(), message: (err as Error).message };
  }
}

import fs from 'node:fs';
import path from 'node:path';
import { Sequelize, Transaction } from 'sequelize';

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
  // IMMEDIATE: a transaction takes the write lock when it begins, so no autocommit write can
  // make its snapshot stale between its first read and its first write.
  const db = new Sequelize({ dialect: 'sqlite', dialectModule: tunedSqlite3, storage, logging, transactionType: Transaction.TYPES.IMMEDIATE });
  if (storage !== ':memory:') serializeTransactions(db);
  return db;
}

/**
 * One SQLite transaction at a time in this process. SQLite has one writer anyway; letting
 * transactions (a connection each) queue inside the driver made them wait in the busy handler,
 * each holding one of libuv's four pool threads, until the transaction holding the lock had no
 * thread left to finish on: 20 concurrent uploads ended in SQLITE_BUSY and 500s. Queued here
 * they wait without a thread. A nested call (options.transaction) joins its parent as before.
 */
function serializeTransactions(db: Sequelize): void {
  type Callback = (t: Transaction) => Promise<unknown>;
  const original = db.transaction.bind(db) as (...args: unknown[]) => Promise<unknown>;
  let tail: Promise<unknown> = Promise.resolve();
  db.transaction = ((optionsOrFn: unknown, maybeFn?: Callback) => {
    const fn = typeof optionsOrFn === 'function' ? (optionsOrFn as Callback) : maybeFn;
    const options = (typeof optionsOrFn === 'function' ? {} : (optionsOrFn ?? {})) as { transaction?: Transaction };
    // Unmanaged transactions and nested ones pass straight through.
    if (!fn || options.transaction) return original(optionsOrFn, maybeFn);
    const run = tail.then(() => original(options, fn));
    tail = run.catch(() => undefined);
    return run;
  }) as typeof db.transaction;
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

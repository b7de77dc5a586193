import fs from 'node:fs';
import path from 'node:path';
import { Sequelize, Transaction } from 'sequelize';

import pg from 'pg';
import sqlite3 from 'sqlite3';
import { serverVersion } from './dialect';

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
  if (!databaseUrl.startsWith('sqlite:')) return openPostgres(databaseUrl, logging);
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

/**
 * PostgreSQL through `pg`. Several server instances may share the database, so what SQLite gets
 * from its one writer comes from PostgreSQL's own means: unique constraints and row locks in the
 * routes, and here a retry of a whole transaction that PostgreSQL aborted as a deadlock or a
 * serialization failure (both say "run it again"; every managed transaction here only touches
 * the database, so running it again is safe).
 */
function openPostgres(databaseUrl: string, logging: false | ((sql: string) => void)): Sequelize {
  const db = new Sequelize(databaseUrl, { dialect: 'postgres', dialectModule: pg, logging, pool: { max: 10, idle: 10_000, acquire: 60_000 } });
  retryAbortedTransactions(db);
  return db;
}

const RETRYABLE = new Set(['40001', '40P01']); // serialization_failure, deadlock_detected
const RETRIES = 4;

function retryAbortedTransactions(db: Sequelize): void {
  type Callback = (t: Transaction) => Promise<unknown>;
  const original = db.transaction.bind(db) as (...args: unknown[]) => Promise<unknown>;
  db.transaction = (async (optionsOrFn: unknown, maybeFn?: Callback) => {
    const fn = typeof optionsOrFn === 'function' ? (optionsOrFn as Callback) : maybeFn;
    const options = (typeof optionsOrFn === 'function' ? {} : (optionsOrFn ?? {})) as { transaction?: Transaction };
    if (!fn || options.transaction) return original(optionsOrFn, maybeFn);
    for (let attempt = 1; ; attempt++) {
      try {
        return await original(options, fn);
      } catch (err) {
        const code = (err as { parent?: { code?: string } }).parent?.code;
        if (!code || !RETRYABLE.has(code) || attempt > RETRIES) throw err;
        await new Promise((r) => setTimeout(r, 5 * 2 ** attempt * Math.random()));
      }
    }
  }) as typeof db.transaction;
}

export type DatabaseStatus = { status: 'ok' | 'down'; dialect: string; serverVersion?: string; message?: string };

/** A cheap round trip to the database, for the health report: which database and its version. */
export async function checkDatabase(db: Sequelize): Promise<DatabaseStatus> {
  try {
    return { status: 'ok', dialect: db.getDialect(), serverVersion: await serverVersion(db) };
  } catch (err) {
    return { status: 'down', dialect: db.getDialect(), message: (err as Error).message };
  }
}

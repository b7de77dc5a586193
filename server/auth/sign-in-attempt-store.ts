import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import { QueryTypes, type Sequelize } from 'sequelize';

type Row = { hits: number | string; resetMs: number | string };

/**
 * express-rate-limit's store on the `sign_in_attempts` table, so that every server instance on
 * one database counts the same failed sign-ins. Each count is an upsert (INSERT … ON CONFLICT,
 * in both dialects), so two instances counting the same client at once cannot lose a hit. Rows of ended windows are swept at most once a window, from
 * `increment`, so the store needs no timer.
 */
export class SignInAttemptStore implements Store {
  /** Counts are shared between processes: the limiter must not assume it sees them all. */
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastSweep = 0;

  constructor(
    private readonly db: Sequelize,
    readonly prefix = 'sign-in:',
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [row] = await this.db.query<Row>('SELECT hits, "resetMs" FROM sign_in_attempts WHERE client = :client AND "resetMs" > :now', {
      replacements: { client: this.prefix + key, now: Date.now() },
      type: QueryTypes.SELECT,
    });
    return row ? info(row) : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const now = Date.now();
    const client = this.prefix + key;
    // The upsert holds the row (PostgreSQL: its row lock; SQLite: the one writer) until the
    // transaction ends, so the count read back is this hit's. A window that has ended starts
    // again at one hit.
    const row = await this.db.transaction(async (transaction) => {
      await this.db.query(
        `INSERT INTO sign_in_attempts (client, hits, "resetMs") VALUES (:client, 1, :reset)
         ON CONFLICT (client) DO UPDATE SET
           hits = CASE WHEN sign_in_attempts."resetMs" <= :now THEN 1 ELSE sign_in_attempts.hits + 1 END,
           "resetMs" = CASE WHEN sign_in_attempts."resetMs" <= :now THEN excluded."resetMs" ELSE sign_in_attempts."resetMs" END`,
        { replacements: { client, reset: now + this.windowMs, now }, transaction },
      );
      const [current] = await this.db.query<Row>('SELECT hits, "resetMs" FROM sign_in_attempts WHERE client = :client', {
        replacements: { client },
        type: QueryTypes.SELECT,
        transaction,
      });
      return current;
    });
    await this.sweep(now);
    return info(row);
  }

  async decrement(key: string): Promise<void> {
    await this.db.query('UPDATE sign_in_attempts SET hits = hits - 1 WHERE client = :client AND hits > 0', { replacements: { client: this.prefix + key } });
  }

  async resetKey(key: string): Promise<void> {
    await this.db.query('DELETE FROM sign_in_attempts WHERE client = :client', { replacements: { client: this.prefix + key } });
  }

  async resetAll(): Promise<void> {
    await this.db.query('DELETE FROM sign_in_attempts WHERE client LIKE :prefix', { replacements: { prefix: `${this.prefix}%` } });
  }

  private async sweep(now: number) {
    if (now - this.lastSweep < this.windowMs) return;
    this.lastSweep = now;
    await this.db.query('DELETE FROM sign_in_attempts WHERE "resetMs" <= :now', { replacements: { now } });
  }
}

const info = (row: Row): ClientRateLimitInfo => ({ totalHits: Number(row.hits), resetTime: new Date(Number(row.resetMs)) });

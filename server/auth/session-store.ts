import session from 'express-session';
import { Op } from 'sequelize';
import { WebSession } from '../db/models';

const DAY_MS = 24 * 60 * 60 * 1000;
const SWEEP_EVERY_MS = 60 * 60 * 1000;

/**
 * express-session's store on the `web_sessions` table. Expired rows are ignored when read and
 * swept at most once an hour from `set`, so the store needs no timer of its own (a timer would
 * keep test processes and `npm run seed` alive).
 */
export class DatabaseSessionStore extends session.Store {
  private lastSweep = 0;

  constructor(private readonly defaultTtlMs = 7 * DAY_MS) {
    super();
  }

  private expiry(sess: session.SessionData): Date {
    const expires = sess.cookie?.expires;
    return expires ? new Date(expires) : new Date(Date.now() + this.defaultTtlMs);
  }

  override get(sid: string, cb: (err: unknown, sess?: session.SessionData | null) => void): void {
    WebSession.findByPk(sid)
      .then((row) => cb(null, row && row.expiresAt.getTime() > Date.now() ? (JSON.parse(row.data) as session.SessionData) : null))
      .catch(cb);
  }

  override set(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    WebSession.upsert({ sid, data: JSON.stringify(sess), expiresAt: this.expiry(sess) })
      .then(() => this.sweep())
      .then(() => cb?.(), (err) => cb?.(err));
  }

  override touch(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    WebSession.update({ expiresAt: this.expiry(sess) }, { where: { sid } }).then(() => cb?.(), (err) => cb?.(err));
  }

  override destroy(sid: string, cb?: (err?: unknown) => void): void {
    WebSession.destroy({ where: { sid } }).then(() => cb?.(), (err) => cb?.(err));
  }

  private async sweep() {
    if (Date.now() - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = Date.now();
    await WebSession.destroy({ where: { expiresAt: { [Op.lt]: new Date() } } });
  }
}

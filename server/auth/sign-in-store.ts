import session from 'express-session';
import { Op } from 'sequelize';
import { WebSession } from '../db/models';

const DAY_MS = 24 * 60 * 60 * 1000;
const SWEEP_EVERY_MS = 60 * 60 * 1000;
const TOUCH_EVERY_MS = 60 * 1000;

/**
 * express-session's store on the `web_sessions` table. Expired rows are ignored when read and
 * swept at most once an hour from `set`, so the store needs no timer of its own (a timer would
 * keep test processes and `npm run seed` alive).
 */
export class SignInStore extends session.Store {
  private lastSweep = 0;
  private readonly touchedAt = new Map<string, number>();

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

  /**
   * express-session touches the session on every request that did not change it. Writing each
   * touch made every read a database write; moving the expiry of a week-long session by less
   * than a minute is not worth one, so a touch within a minute of the last is skipped.
   */
  override touch(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    const now = Date.now();
    if (now - (this.touchedAt.get(sid) ?? 0) < TOUCH_EVERY_MS) return void cb?.();
    if (this.touchedAt.size > 10_000) this.touchedAt.clear();
    this.touchedAt.set(sid, now);
    WebSession.update({ expiresAt: this.expiry(sess) }, { where: { sid } }).then(() => cb?.(), (err) => cb?.(err));
  }

  override destroy(sid: string, cb?: (err?: unknown) => void): void {
    this.touchedAt.delete(sid);
    WebSession.destroy({ where: { sid } }).then(() => cb?.(), (err) => cb?.(err));
  }

  private async sweep() {
    if (Date.now() - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = Date.now();
    await WebSession.destroy({ where: { expiresAt: { [Op.lt]: new Date() } } });
  }
}

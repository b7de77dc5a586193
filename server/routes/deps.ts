import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import type { Mailer } from '../mail/mailer';

/** What the routers need from the app: the database, the mailer and a few settings. */
export interface RouteDeps {
  config: Config;
  db: Sequelize;
  mailer: Mailer;
  /** Where bitstreams are stored. */
  uploadDir: string;
  /** bcrypt work factor for new passwords. */
  bcryptCost: number;
}

/** Send mail after the change is committed; a mail failure is logged, it does not undo the change. */
export async function mailSafely(send: () => Promise<void>): Promise<boolean> {
  try {
    await send();
    return true;
  } catch (err) {
    console.error('mail not sent:', (err as Error).message);
    return false;
  }
}

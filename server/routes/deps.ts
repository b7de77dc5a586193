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

// Mail is sent after the change is committed; services send theirs the same way.
export { mailSafely } from '../mail/safely';

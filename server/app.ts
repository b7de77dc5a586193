import fs from 'node:fs';
import path from 'node:path';
import express from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { clientDistDir, projectRoot } from './paths';
import { healthRouter } from './routes/health';

export interface AppDeps {
  config: Config;
  db: Sequelize;
  /** Where the built client lives; served in production. */
  clientDir?: string;
}

const version = (JSON.parse(fs.readFileSync(path.join(projectRoot, 'package.json'), 'utf8')) as { version: string }).version;

/** Build the Express app. It does not listen: tests drive it with supertest. */
export function createApp({ config, db, clientDir = clientDistDir }: AppDeps) {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(express.json({ limit: '1mb' }));

  app.use('/api/health', healthRouter(db, version));
  app.use('/api', apiNotFound);

  if (config.nodeEnv === 'production') {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET gets the single page.
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }

  app.use(errorHandler());
  return app;
}

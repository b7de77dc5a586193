import fs from 'node:fs';
import path from 'node:path';
import express from 'express';
import type { Sequelize } from 'sequelize';
import { installAuth } from './auth';
import { DEFAULT_BCRYPT_COST } from './auth/passwords';
import type { Config } from './config';
import { initModels } from './db/models';
import { createSmtpMailer, discardingMailer, type Mailer } from './mail/mailer';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { clientDistDir, dataDir, projectRoot } from './paths';
import { auditRouter, outboxRouter } from './routes/admin';
import { CHECK_REPLIES } from './routes/reply';
import { authRouter, type LoginLimit } from './routes/auth';
import { SignInAttemptStore } from './auth/sign-in-attempt-store';
import { boardsRouter } from './routes/boards';
import { buildsRouter } from './routes/builds';
import { commentsRouter, sessionCommentsRouter } from './routes/comments';
import { compareRouter } from './routes/compare';
import { conditionGridRouter } from './routes/condition-grid';
import { coresRouter } from './routes/cores';
import type { RouteDeps } from './routes/deps';
import { goldenVectorsRouter } from './routes/golden-vectors';
import { healthRouter } from './routes/health';
import { invitationsRouter } from './routes/invitations';
import { sessionExplanationRouter } from './routes/session-explanation';
import { sessionsRouter } from './routes/sessions';
import { tokensRouter } from './routes/tokens';
import { usersRouter } from './routes/users';
import { securityHeaders } from './security-headers';
import { createSocketDispatcher } from './sockets/upgrade';
import { registerSimBoards } from './sockets/sim-boards';
import { installStations, type StationOptions } from './stations';

export interface AppDeps {
  config: Config;
  db: Sequelize;
  /** Where the built client lives; served in production. */
  clientDir?: string;
  /** Where e-mail goes; by default SMTP_URL, or nowhere when it is unset. */
  mailer?: Mailer;
  /** Where bitstreams are stored (default data/uploads). */
  uploadDir?: string;
  /** bcrypt work factor for new passwords (tests lower it). */
  bcryptCost?: number;
  /** Failed sign-ins allowed per address (default 10 in 15 minutes). */
  loginLimit?: LoginLimit;
  /** The station relay's clock and idle timeout (tests shorten it). */
  stations?: StationOptions;
}

const version = (JSON.parse(fs.readFileSync(path.join(projectRoot, 'package.json'), 'utf8')) as { version: string }).version;

/**
 * Build the Express app. It does not listen: tests drive it with supertest. `app.sockets` holds
 * the WebSocket routes; whoever listens attaches it to the HTTP(S) server.
 */
export function createApp({
  config,
  db,
  clientDir = clientDistDir,
  mailer = config.smtpUrl ? createSmtpMailer(config.smtpUrl) : discardingMailer,
  uploadDir = path.join(dataDir, 'uploads'),
  bcryptCost = DEFAULT_BCRYPT_COST,
  loginLimit = { windowMs: 15 * 60 * 1000, max: 10 },
  stations,
}: AppDeps) {
  initModels(db);
  const deps: RouteDeps = { config, db, mailer, uploadDir, bcryptCost };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);
  app.set('public url', config.publicUrl);
  app.set(CHECK_REPLIES, config.nodeEnv !== 'production');
  app.use(securityHeaders(config));
  app.use(express.json({ limit: '1mb' }));

  app.use('/api/health', healthRouter(db, version));
  const { passport, authenticateUpgrade } = installAuth(app, config);
  const sockets = createSocketDispatcher({ authenticate: authenticateUpgrade, allowedOrigins: config.publicUrl ? [new URL(config.publicUrl).origin] : [] });
  registerSimBoards(sockets, config);
  installStations(app, sockets, stations);
  app.use('/api/auth', authRouter(passport, loginLimit, new SignInAttemptStore(db)));
  app.use('/api/tokens', tokensRouter(deps));
  app.use('/api/users', usersRouter(deps));
  app.use('/api/invitations', invitationsRouter(deps));
  app.use('/api/cores/:id/golden-vectors', goldenVectorsRouter(deps));
  app.use('/api/cores', coresRouter(deps));
  app.use('/api/builds', buildsRouter(deps));
  app.use('/api/boards', boardsRouter(deps));
  app.use('/api/sessions/:sessionId/comments', sessionCommentsRouter(deps));
  app.use('/api/sessions/:sessionId/explanation', sessionExplanationRouter(deps));
  app.use('/api/sessions', sessionsRouter(deps));
  app.use('/api/comments', commentsRouter(deps));
  app.use('/api/compare', compareRouter(deps));
  app.use('/api/condition-grid', conditionGridRouter());
  app.use('/api/audit', auditRouter());
  app.use('/api/outbox', outboxRouter());
  app.use('/api', apiNotFound);

  if (config.nodeEnv === 'production') {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET gets the single page.
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }

  app.use(errorHandler());
  return Object.assign(app, { sockets });
}

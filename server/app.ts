import connectPgSimple from 'connect-pg-simple';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import session from 'express-session';
import type { Pool } from 'pg';
import type { AppContext } from './context';
import { createPassport } from './middleware/auth';
import { csrfProtection } from './middleware/csrf';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { cspNonce, securityHeaders } from './middleware/security';
import { analysisRoutes } from './routes/analyses.routes';
import { authRoutes, SESSION_COOKIE } from './routes/auth.routes';
import { healthRoutes } from './routes/health.routes';
import { invitationRoutes } from './routes/invitations.routes';
import { logRoutes } from './routes/logs.routes';
import { preferenceRoutes } from './routes/preferences.routes';
import { revisionRoutes } from './routes/revisions.routes';
import { tableRoutes } from './routes/tables.routes';
import { teamRoutes } from './routes/team.routes';
import { vehicleRoutes } from './routes/vehicles.routes';
import { staticClient } from './static-client';

/** Options for building the app. */
export interface AppOptions {
  /** The pool the session store writes through. */
  pool: Pool;
  /** Whether to serve the built client (off in API tests). */
  serveClient?: boolean;
}

/** A built app and what must be closed with it. */
export interface BuiltApp {
  /** The Express app (not listening: index.ts or supertest does that). */
  app: Express;
  /** Stops the session store's pruning timer. */
  close(): void;
}

/** Builds the Express app: security, sessions, CSRF, the API, the client, one error handler. */
export function createApp(ctx: AppContext, options: AppOptions): BuiltApp {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');

  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool: options.pool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: ctx.config.env === 'test' ? false : 15 * 60,
  });
  const auth = createPassport(ctx.db);

  app.use(cspNonce, securityHeaders(ctx.config.cookieSecure));
  app.use(express.json({ limit: '1mb' }));
  app.use(cookieParser());
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: ctx.config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: ctx.config.cookieSecure,
        maxAge: 12 * 60 * 60 * 1000,
        path: '/',
      },
    }),
  );
  app.use(auth.initialize());
  app.use(auth.session());
  app.use(csrfProtection(ctx.config.sessionSecret, ctx.config.cookieSecure));

  const api = express.Router();
  api.use(healthRoutes(ctx));
  api.use(authRoutes(ctx, auth));
  api.use(preferenceRoutes(ctx));
  api.use(invitationRoutes(ctx));
  api.use(teamRoutes(ctx));
  api.use(vehicleRoutes(ctx));
  api.use(tableRoutes(ctx));
  api.use(revisionRoutes(ctx));
  api.use(logRoutes(ctx));
  api.use(analysisRoutes(ctx));
  api.use(apiNotFound);
  app.use('/api', api);

  if (options.serveClient !== false) app.use(staticClient(ctx.config.clientDist));
  app.use(errorHandler);

  return { app, close: () => store.close() };
}

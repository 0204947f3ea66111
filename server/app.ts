import 'reflect-metadata';
import connectPgSimple from 'connect-pg-simple';
import cookieParser from 'cookie-parser';
import { doubleCsrf } from 'csrf-csrf';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Pool } from 'pg';
import type { DataSource } from 'typeorm';
import { sessionSecret, type Env } from './config/env';
import { ApiRoutes } from './lib/routes';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { AuditService } from './modules/audit/audit.service';
import { registerAuditRoutes } from './modules/audit/audit.router';
import { configurePassport, registerAuthRoutes } from './modules/auth/auth.router';
import { PostgresRateLimitStore } from './modules/auth/rate-limit-store';
import { registerHealthRoutes } from './modules/health/health.router';
import { registerMailRoutes } from './modules/mail/mail.router';
import type { Mailer } from './modules/mail/mailer';
import { UserService } from './modules/users/user.service';
import { registerUserRoutes } from './modules/users/user.router';
import { registerLibraryRoutes } from './modules/library/library.router';
import { getLibraryFile } from './modules/library/library.service';
import { recordUnmatchedFootprints } from './modules/library/unmatched.service';
import { CheckPool } from './modules/programs/check-pool';
import { ProgramService, type LibrarySource } from './modules/programs/program.service';
import { registerProgramRoutes } from './modules/programs/program.router';
import { RunFileService } from './modules/programs/run-file.service';
import { UnauthenticatedError } from './lib/errors';
import { registerOpenApiRoutes } from './lib/openapi';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
export const APP_VERSION = '0.1.0';

export interface AppDeps {
  ds: DataSource;
  env: Env;
  mailer: Mailer;
}

export interface Services {
  audit: AuditService;
  users: UserService;
  mailer: Mailer;
  programs: ProgramService;
  runFiles: RunFileService;
  checks: CheckPool;
}

/** Builds the Express app without listening, so supertest can drive it. */
export function createApp(deps: AppDeps): Express & { locals: { routes: ApiRoutes['specs']; services: Services } } {
  const { ds, env, mailer } = deps;
  const app = express();
  app.disable('x-powered-by');
  if (env.TRUST_PROXY) app.set('trust proxy', 1);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  const audit = new AuditService(ds);
  const users = new UserService(ds, audit);
  const publicUrl = (env.PUBLIC_URL ?? `http://localhost:${env.PORT}`).replace(/\/$/, '');
  const checks = new CheckPool();
  const library: LibrarySource = { getLibraryFile: (m) => getLibraryFile(m ?? ds.manager), recordUnmatchedFootprints };
  const programs = new ProgramService(ds, { audit, mailer, users, library, checks, publicUrl });
  const runFiles = new RunFileService(ds, { audit, mailer, publicUrl });
  const services: Services = { audit, users, mailer, programs, runFiles, checks };

  const PgStore = connectPgSimple(session);
  // The pg Pool TypeORM already holds; sessions live in PostgreSQL so instances stay stateless.
  const pool = (ds.driver as unknown as { master: Pool }).master;
  const secure = 'auto' as const; // Secure when the request came over https (trust proxy honoured).
  app.use(
    session({
      name: 'pw.sid',
      store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: env.NODE_ENV === 'test' ? false : 15 * 60 }),
      secret: sessionSecret(env),
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: 10 * 60 * 60 * 1000 },
    }),
  );
  app.use(cookieParser());

  const passport = configurePassport(users);
  app.use(passport.initialize());
  app.use(passport.session());

  const { generateCsrfToken, doubleCsrfProtection } = doubleCsrf({
    getSecret: () => sessionSecret(env) + ':csrf',
    // Bound to the session once signed in; before that (sign-in itself) to the cookie alone.
    getSessionIdentifier: (req) => (req.user ? req.sessionID : 'anonymous'),
    cookieName: 'pw.csrf',
    cookieOptions: { sameSite: 'lax', path: '/', secure: false, httpOnly: true },
    getCsrfTokenFromRequest: (req) => req.headers['x-csrf-token'],
  });

  // Line computers: `Authorization: Bearer pwt_…` (read-only; only routes that name `line-token`).
  app.use('/api', async (req, _res, next) => {
    const h = req.headers.authorization;
    if (!h) return next();
    const m = /^Bearer\s+(\S+)$/i.exec(h);
    const t = m ? await runFiles.findToken(m[1]) : null;
    if (!t) return next(new UnauthenticatedError('The API token is not valid or was revoked. Ask an engineer for a new one.'));
    req.lineToken = { id: t.id, name: t.name };
    next();
  });
  // Images for the canvas underlay are larger than anything else sent as JSON.
  app.use('/api/revisions/:id/underlay', express.json({ limit: '10mb' }));
  app.use('/api', express.json({ limit: '1mb' }));
  app.use('/api', doubleCsrfProtection);

  const api = new ApiRoutes();
  registerHealthRoutes(api, ds, APP_VERSION);
  registerAuthRoutes(api, { passport, users, audit, signInLimit: env.LOGIN_RATE_LIMIT, rateLimitStore: new PostgresRateLimitStore(ds, 'sign-in:'), csrfToken: (req, res) => generateCsrfToken(req, res, { overwrite: false, validateOnReuse: false }) });
  registerUserRoutes(api, users);
  registerAuditRoutes(api, audit);
  registerMailRoutes(api, ds);
  registerLibraryRoutes(api, { ds, audit, users, mailer, publicUrl });
  registerProgramRoutes(api, programs, runFiles);
  registerOpenApiRoutes(api, APP_VERSION);
  app.use('/api', api.router);
  app.use('/api', apiNotFound);

  const clientDir = join(ROOT, 'dist', 'client');
  if (existsSync(join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => res.sendFile(join(clientDir, 'index.html')));
  }

  app.use(errorHandler);
  app.locals.routes = api.specs;
  app.locals.services = services;
  return app as never;
}

import bcrypt from 'bcryptjs';
import type { Request } from 'express';
import { rateLimit, type Store } from 'express-rate-limit';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { signInInputSchema } from '../../../shared/schemas/auth.schema';
import type { User } from '../../db/entities/user.entity';
import { TooManyRequestsError, UnauthenticatedError, isDatabaseUnavailable } from '../../lib/errors';
import type { ApiRoutes } from '../../lib/routes';
import { validate } from '../../middleware/validate';
import type { AuditActor, AuditService } from '../audit/audit.service';
import type { UserService } from '../users/user.service';
import { toUserDto } from '../users/user.service';

export function actorOf(req: Request): AuditActor {
  return { id: req.user?.id ?? null, email: req.user?.email ?? null };
}

// Compared against when the e-mail is unknown, so both failures take the same time.
const DUMMY_HASH = bcrypt.hashSync('placewright-no-such-user', 10);

export function configurePassport(users: UserService) {
  const p = new passport.Passport();
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      users
        .findActiveByEmail(email)
        .then(async (user) => {
          const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
          done(null, user && ok ? user : false);
        })
        .catch(done);
    }),
  );
  p.serializeUser((user, done) => done(null, (user as User).id));
  p.deserializeUser((id: string, done) => {
    users
      .get(id)
      .then((u) => done(null, u.active ? u : false))
      // a user who is gone signs out; a database that does not answer is an error (503), not a sign-out
      .catch((e: unknown) => (isDatabaseUnavailable(e) ? done(e) : done(null, false)));
  });
  return p;
}

export function registerAuthRoutes(
  api: ApiRoutes,
  deps: {
    passport: passport.Authenticator;
    users: UserService;
    audit: AuditService;
    signInLimit: number;
    csrfToken: (req: Request, res: import('express').Response) => string;
    /** where the sign-in limiter counts (PostgreSQL in the app: shared by instances, kept over restarts) */
    rateLimitStore?: Store;
  },
) {
  const { passport: p, audit } = deps;

  const limiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.signInLimit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    ...(deps.rateLimitStore ? { store: deps.rateLimitStore } : {}),
    handler: (_req, _res, next) =>
      next(new TooManyRequestsError('Too many sign-in attempts from this address. Wait 15 minutes and try again, or ask an admin to reset your password.')),
  });

  api.get('/auth/csrf', 'public', (req, res) => {
    res.json({ token: deps.csrfToken(req, res) });
  });

  api.post('/auth/sign-in', 'public', limiter, validate(signInInputSchema), (req, res, next) => {
    p.authenticate('local', { session: true }, (err: unknown, user: User | false) => {
      if (err) return next(err);
      const ip = req.ip ?? null;
      if (!user) {
        audit
          .record(null, 'auth.sign-in-failed', req.body.email, {}, ip)
          .then(() => next(new UnauthenticatedError('The e-mail or password is not right. Check both and try again.')))
          .catch(next);
        return;
      }
      req.logIn(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        user.lastSignInAt = new Date();
        deps.users
          .touchSignIn(user.id)
          .then(() => audit.record({ id: user.id, email: user.email }, 'auth.sign-in', user.email, {}, ip))
          .then(() => res.json({ user: toUserDto(user), csrfToken: deps.csrfToken(req, res) }))
          .catch(next);
      });
    })(req, res, next);
  });

  api.post('/auth/sign-out', 'signed-in', (req, res, next) => {
    const actor = actorOf(req);
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie('pw.sid');
        audit.record(actor, 'auth.sign-out', actor.email, {}, req.ip ?? null).then(() => res.status(204).end()).catch(next);
      });
    });
  });

  api.get('/me', 'signed-in', (req, res) => {
    res.json({ user: toUserDto(req.user!) });
  });
}

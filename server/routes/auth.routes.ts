import { Router, type Request, type RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type passport from 'passport';
import { loginRequestSchema } from '../../shared/contracts/auth';
import type { AppContext } from '../context';
import { AppError } from '../errors/app-error';
import { currentUser, requireSignedIn } from '../middleware/auth';
import { validate } from '../middleware/validate';
import { recordAudit } from '../repositories/audit.repository';
import type { SessionUserRecord } from '../repositories/users.repository';

/** The session cookie's name. */
export const SESSION_COOKIE = 'cellsmith.sid';

function toSessionResponse(user: SessionUserRecord) {
  return { user: { ...user } };
}

/** Failed sign-ins are limited per account and address; successful ones do not count. */
function loginLimiter(ctx: AppContext): RequestHandler {
  return rateLimit({
    windowMs: ctx.config.loginWindowMs,
    limit: ctx.config.loginMaxFailures,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req: Request) => {
      const body = req.body as { email?: unknown } | undefined;
      const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
      return `${ipKeyGenerator(req.ip ?? 'unknown')}|${email}`;
    },
    handler: (req, res, next) => {
      const resetTime = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit
        ?.resetTime;
      const seconds = resetTime
        ? Math.max(1, Math.ceil((resetTime.getTime() - Date.now()) / 1000))
        : 900;
      res.setHeader('Retry-After', String(seconds));
      next(
        new AppError(
          429,
          'too_many_requests',
          `Too many failed sign-ins; try again in ${Math.ceil(seconds / 60)} min`,
          { retryAfterSeconds: seconds },
        ),
      );
    },
  });
}

/** Signs in, out, and tells who is signed in. */
export function authRoutes(ctx: AppContext, auth: passport.PassportStatic): Router {
  const router = Router();

  router.post(
    '/auth/login',
    loginLimiter(ctx),
    validate({ body: loginRequestSchema }),
    (req, res, next) => {
      auth.authenticate(
        'local',
        { session: false },
        (err: unknown, user: SessionUserRecord | false) => {
          if (err) return next(err);
          if (!user) return next(new AppError(401, 'not_signed_in', 'Wrong e-mail or password'));
          // req.logIn regenerates the session: a new id at every sign-in defeats session fixation.
          req.logIn(user, (loginErr) => {
            if (loginErr) return next(loginErr);
            recordAudit(ctx.db, {
              shopId: user.shopId,
              actorId: user.id,
              action: 'auth.signed_in',
            }).then(() => res.json(toSessionResponse(user)), next);
          });
        },
      )(req, res, next);
    },
  );

  router.post('/auth/logout', requireSignedIn, (req, res, next) => {
    const user = currentUser(req);
    req.logOut((logoutErr) => {
      if (logoutErr) return next(logoutErr);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie(SESSION_COOKIE, { path: '/' });
        recordAudit(ctx.db, {
          shopId: user.shopId,
          actorId: user.id,
          action: 'auth.signed_out',
        }).then(() => res.status(204).end(), next);
      });
    });
  });

  router.get('/auth/me', requireSignedIn, (req, res) => {
    res.json(toSessionResponse(currentUser(req)));
  });

  return router;
}

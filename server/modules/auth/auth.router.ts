import { Router } from 'express';
import type { Request, Response, NextFunction } from 'express';
import type { PassportStatic as Passport } from 'passport';
import {
  changePasswordSchema,
  resetPasswordSchema,
  resetRequestSchema,
  signInSchema,
  signUpSchema,
  tokenParamSchema,
  updateAccountSchema,
} from '@shared/schemas/auth';
import { switchTeamSchema } from '@shared/schemas/team';
import { ERROR_CODES } from '@shared/schemas/api-error';
import { AppError, notFound } from '../../lib/errors';
import { requireUser } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { AuthService, SessionUser } from './auth.service';
import { toSessionUser, tokenInvalid } from './auth.service';
import type { SignInThrottle } from './throttle';
import type { RateLimits } from '../../lib/rate-limits';
import { signInSession } from './session-guard';

declare module 'express-session' {
  interface SessionData {
    activeTeamId?: string;
  }
}

type Deps = {
  auth: AuthService;
  passport: Passport;
  throttle: SignInThrottle;
  limits: RateLimits;
  csrfToken: (req: Request, overwrite?: boolean) => string;
};

export const SESSION_COOKIE_NAME = 'sheetsmith.sid';

const badCredentials = () => new AppError(401, ERROR_CODES.badCredentials, 'That e-mail and password do not match an account.');

// Passport regenerates the session id when signing in (no session fixation).
const logIn = signInSession;

function authenticate(passport: Passport, req: Request, res: Response, next: NextFunction) {
  return new Promise<SessionUser | false>((resolve, reject) => {
    passport.authenticate('local', { session: false }, (error: unknown, user: SessionUser | false) =>
      error ? reject(error) : resolve(user),
    )(req, res, next);
  });
}

export function authRouter({ auth, passport, throttle, limits, csrfToken }: Deps): Router {
  const router = Router();

  router.get('/auth/csrf', (req, res) => {
    res.json({ csrfToken: csrfToken(req) });
  });

  router.post(
    '/auth/sign-up',
    route({ body: signUpSchema }, async ({ body }, req) => {
      await limits.consume({ signUpPerAddress: req.ip ?? 'unknown' });
      const user = await auth.signUp(body);
      await logIn(req, toSessionUser(user));
      return auth.me(toSessionUser(user), undefined, csrfToken(req, true));
    }),
  );

  router.post(
    '/auth/sign-in',
    route({ body: signInSchema }, async ({ body }, req, res) => {
      const ip = req.ip ?? 'unknown';
      await throttle.check(body.email, ip);
      req.body = body; // passport-local reads the normalised e-mail
      const user = await authenticate(passport, req, res, () => undefined);
      if (!user) {
        await throttle.failed(body.email, ip);
        throw badCredentials();
      }
      await throttle.succeeded(body.email, ip);
      await logIn(req, user);
      return auth.me(user, undefined, csrfToken(req, true));
    }),
  );

  router.post('/auth/sign-out', (req, res, next) => {
    req.logout((error) => {
      if (error) return next(error);
      req.session.destroy((destroyError) => {
        if (destroyError) return next(destroyError);
        res.clearCookie(SESSION_COOKIE_NAME);
        res.status(204).end();
      });
    });
  });

  router.post(
    '/auth/password-reset',
    route({ body: resetRequestSchema }, async ({ body }, req) => {
      // Counted whether or not the address has an account, so a refusal reveals nothing.
      await limits.consume({ resetPerEmail: body.email, resetPerAddress: req.ip ?? 'unknown' });
      await auth.requestPasswordReset(body.email);
      return { ok: true, message: 'If that e-mail has an account, a reset link is on its way.' };
    }),
  );

  router.get(
    '/auth/password-reset/:token',
    route({ params: tokenParamSchema }, async ({ params }) => {
      const reset = await auth.findValidReset(params.token);
      if (!reset) throw tokenInvalid('password reset');
      return { email: reset.user!.email, expiresAt: reset.expiresAt.toISOString() };
    }),
  );

  router.post(
    '/auth/password-reset/:token',
    route({ params: tokenParamSchema, body: resetPasswordSchema }, async ({ params, body }) => {
      const user = await auth.resetPassword(params.token, body.password);
      return { ok: true, email: user.email };
    }),
  );

  router.get(
    '/me',
    requireUser,
    route({}, (_input, req) => auth.me(req.user!, req.session.activeTeamId, csrfToken(req))),
  );

  router.patch(
    '/me',
    requireUser,
    route({ body: updateAccountSchema }, async ({ body }, req) => {
      const user = await auth.updateAccount(req.user!.id, body);
      return auth.me(toSessionUser(user), req.session.activeTeamId, csrfToken(req));
    }),
  );

  router.post(
    '/me/password',
    requireUser,
    route({ body: changePasswordSchema }, async ({ body }, req, res) => {
      const epoch = await auth.changePassword(req.user!.id, body.currentPassword, body.newPassword);
      // Every other session ends; this one carries on in the new epoch.
      req.session.epoch = epoch;
      res.status(204).end();
    }),
  );

  router.post('/me/sign-out-everywhere', requireUser, (req, res, next) => {
    auth
      .endSessions(req.user!.id)
      .then(() => req.session.destroy((error) => (error ? next(error) : (res.clearCookie(SESSION_COOKIE_NAME), res.status(204).end()))))
      .catch(next);
  });

  router.put(
    '/me/active-team',
    requireUser,
    route({ body: switchTeamSchema }, async ({ body }, req) => {
      const me = await auth.me(req.user!, body.teamId, csrfToken(req));
      if (me.activeTeamId !== body.teamId) throw notFound('That team');
      req.session.activeTeamId = body.teamId;
      return me;
    }),
  );

  return router;
}

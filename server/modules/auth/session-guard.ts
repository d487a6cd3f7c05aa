import type { Request, RequestHandler } from 'express';
import type { Env } from '../../config/env';
import type { SessionUser } from './auth.service';

declare module 'express-session' {
  interface SessionData {
    /** The user's session epoch at sign-in; a password change or reset moves the user's on. */
    epoch?: number;
    /** When the person signed in (ms); the absolute lifetime counts from here. */
    startedAt?: number;
  }
}

/** Signs the user into the request's session (a new session id: no fixation) and stamps it. */
export function signInSession(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) =>
    req.login(user, (error) => {
      if (error) return reject(error);
      req.session.epoch = user.sessionEpoch;
      req.session.startedAt = Date.now();
      resolve();
    }),
  );
}

/**
 * Ends a signed-in session that outlived its absolute lifetime (ASVS 4.0 §3.3.2) or began before
 * the user's last password change, reset or "sign out everywhere" (§3.3.3). The request goes on
 * signed out, in a fresh empty session; the idle timeout is the cookie's and the store's expiry.
 */
export function sessionGuard(env: Pick<Env, 'SESSION_ABSOLUTE_SECONDS'>): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next();
    const session = req.session;
    session.startedAt ??= Date.now(); // sessions from before this guard start counting now
    const tooOld = Date.now() - session.startedAt > env.SESSION_ABSOLUTE_SECONDS * 1000;
    const superseded = (session.epoch ?? 0) !== req.user.sessionEpoch;
    if (!tooOld && !superseded) return next();
    session.regenerate((error) => {
      req.user = undefined;
      next(error);
    });
  };
}

import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { Env } from '../config/env';

/**
 * Response headers of a hardened web app (OWASP ASVS 4.0 §14.4): a content security policy that
 * allows only this origin (no inline script, no framing), nosniff, a strict referrer policy, and
 * HSTS once the app is served over HTTPS (COOKIE_SECURE). Images may also be `data:`/`blob:` URLs,
 * which the canvas and the upload previews make in the page itself.
 */
export function securityHeaders(env: Pick<Env, 'COOKIE_SECURE'>): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': ["'self'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'worker-src': ["'self'"],
        'object-src': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
        ...(env.COOKIE_SECURE ? { 'upgrade-insecure-requests': [] } : {}),
      },
    },
    frameguard: { action: 'deny' },
    referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
    strictTransportSecurity: env.COOKIE_SECURE ? { maxAge: 365 * 24 * 60 * 60, includeSubDomains: true } : false,
    crossOriginEmbedderPolicy: false,
  });
}

/** API answers are personal and change: no browser or proxy keeps them (ASVS 4.0 §8.2.1). Routes that serve immutable files set their own. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};

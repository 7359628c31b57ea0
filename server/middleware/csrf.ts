import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler } from 'express';
import { AppError } from '../errors/app-error';

/** The cookie that carries the token; Angular's HttpClient reads it by this name. */
export const XSRF_COOKIE = 'XSRF-TOKEN';
/** The header Angular's HttpClient echoes the token in. */
export const XSRF_HEADER = 'x-xsrf-token';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function sign(secret: string, nonce: string): string {
  return createHmac('sha256', secret).update(`xsrf:${nonce}`).digest('base64url');
}

/** Makes a token `nonce.signature`, signed so a cookie planted by a sibling site fails. */
export function makeXsrfToken(secret: string): string {
  const nonce = randomBytes(18).toString('base64url');
  return `${nonce}.${sign(secret, nonce)}`;
}

/** Whether `token` was made by `makeXsrfToken` with `secret`. */
export function isXsrfTokenValid(secret: string, token: string | undefined): boolean {
  if (!token) return false;
  const [nonce, signature, extra] = token.split('.');
  if (!nonce || !signature || extra !== undefined) return false;
  const expected = Buffer.from(sign(secret, nonce));
  const given = Buffer.from(signature);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

/**
 * Signed double-submit CSRF defence. Every response without a valid token cookie gets one
 * (readable by scripts on our origin, SameSite=Strict); every state-changing request must
 * echo it in `X-XSRF-TOKEN`, or it is refused with 403 before any route runs.
 */
export function csrfProtection(secret: string, secure: boolean): RequestHandler {
  return (req, res, next) => {
    const cookies = (req as { cookies?: Record<string, string | undefined> }).cookies ?? {};
    const cookie = cookies[XSRF_COOKIE];
    const cookieValid = isXsrfTokenValid(secret, cookie);
    if (!cookieValid) {
      res.cookie(XSRF_COOKIE, makeXsrfToken(secret), {
        httpOnly: false,
        sameSite: 'strict',
        secure,
        path: '/',
      });
    }
    if (SAFE_METHODS.has(req.method)) {
      next();
      return;
    }
    const header = req.get(XSRF_HEADER);
    if (!cookieValid || !header || header !== cookie) {
      throw new AppError(
        403,
        'csrf',
        'Missing or wrong X-XSRF-TOKEN header: echo the XSRF-TOKEN cookie (set by any GET)',
      );
    }
    next();
  };
}

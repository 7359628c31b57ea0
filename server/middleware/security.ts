import { randomBytes } from 'node:crypto';
import type { RequestHandler } from 'express';
import helmet from 'helmet';

/** Gives each response a fresh CSP nonce in `res.locals.cspNonce`. */
export const cspNonce: RequestHandler = (_req, res, next) => {
  res.locals['cspNonce'] = randomBytes(16).toString('base64');
  next();
};

/**
 * helmet with a strict Content-Security-Policy: scripts, fonts and connections from our own
 * origin only; styles from our origin plus those Angular injects carrying the per-request
 * nonce (the index page hands Angular the nonce).
 */
export function securityHeaders(isHttps: boolean): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: [
          "'self'",
          (_req, res) =>
            `'nonce-${(res as unknown as { locals: { cspNonce: string } }).locals.cspNonce}'`,
        ],
        fontSrc: ["'self'"],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(isHttps ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    strictTransportSecurity: isHttps,
    crossOriginEmbedderPolicy: false,
  });
}

import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Router } from 'express';

/** The text in the built index.html that each response replaces with its CSP nonce. */
const NONCE_PLACEHOLDER = /CSP_NONCE/g;

/**
 * Serves the built Angular app: hashed assets with long caching, and index.html (with this
 * response's CSP nonce) for every other GET outside `/api`, so deep links work.
 */
export function staticClient(dist: string): Router {
  const router = express.Router();
  const indexFile = join(dist, 'index.html');
  if (!existsSync(indexFile)) {
    router.get('/{*splat}', (_req, res) => {
      res
        .status(503)
        .type('text/plain')
        .send('The client is not built yet: run `npm start` (or `npm run build`) first.');
    });
    return router;
  }
  const indexHtml = readFileSync(indexFile, 'utf8');
  router.use(
    express.static(dist, {
      index: false,
      setHeaders(res, path) {
        const isHashed = /-[A-Z0-9]{8}\.(js|css|woff2?|ttf|svg|png)$/i.test(path);
        res.setHeader(
          'Cache-Control',
          isHashed ? 'public, max-age=31536000, immutable' : 'no-cache',
        );
      },
    }),
  );
  router.get('/{*splat}', (_req, res) => {
    const nonce = res.locals['cspNonce'] as string;
    res.setHeader('Cache-Control', 'no-store');
    res.type('html').send(indexHtml.replace(NONCE_PLACEHOLDER, nonce));
  });
  return router;
}

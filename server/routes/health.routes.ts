import { sql } from 'drizzle-orm';
import { Router } from 'express';
import type { AppContext } from '../context';
import { AppError } from '../errors/app-error';

/** `GET /api/health` and `GET /api/meta`. */
export function healthRoutes(ctx: AppContext): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    try {
      await ctx.db.execute(sql`select 1`);
    } catch (err) {
      // The database is down: say so with 503 rather than a generic 500.
      console.error('[cellsmith] health check: database unreachable:', err);
      throw new AppError(503, 'internal', 'The database does not answer');
    }
    res.json({ ok: true });
  });
  router.get('/meta', (_req, res) => {
    res.json({
      mailCapture: ctx.capturedMailDir !== null,
      version: process.env['npm_package_version'] ?? '0.1.0',
    });
  });
  return router;
}

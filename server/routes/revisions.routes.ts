import { Router } from 'express';
import {
  compareRevisionsQuerySchema,
  exportRevisionQuerySchema,
  revisionIdParamSchema,
} from '../../shared/contracts/tables';
import type { AppContext } from '../context';
import { currentUser, requireSignedIn } from '../middleware/auth';
import { handle } from '../middleware/validate';
import { compareRevisions, exportRevision, getRevision } from '../services/revisions.service';

/** Reading revisions: one with its values, its export as a file, and two compared. */
export function revisionRoutes(ctx: AppContext): Router {
  const router = Router();

  // Declared before `/revisions/:id` so the word `compare` is never taken for an id.
  router.get(
    '/revisions/compare',
    requireSignedIn,
    ...handle({ query: compareRevisionsQuerySchema }, async ({ query }, req, res) => {
      res.json(await compareRevisions(ctx.db, currentUser(req), query));
    }),
  );

  router.get(
    '/revisions/:id',
    requireSignedIn,
    ...handle({ params: revisionIdParamSchema }, async ({ params }, req, res) => {
      res.json(await getRevision(ctx.db, currentUser(req), params.id));
    }),
  );

  router.get(
    '/revisions/:id/export',
    requireSignedIn,
    ...handle(
      { params: revisionIdParamSchema, query: exportRevisionQuerySchema },
      async ({ params, query }, req, res) => {
        const file = await exportRevision(ctx.db, currentUser(req), params.id, query.format);
        res.attachment(file.fileName);
        res.type(file.contentType).send(file.text);
      },
    ),
  );

  return router;
}

import { Router } from 'express';
import {
  analysisSamplesQuerySchema,
  applyAnalysisRequestSchema,
  createAnalysisRequestSchema,
  listAnalysesQuerySchema,
} from '../../shared/contracts/analyses';
import { idParam } from '../../shared/contracts/id-param';
import { tableIdParamSchema } from '../../shared/contracts/tables';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { handle } from '../middleware/validate';
import { analysisSamples } from '../services/analysis-samples';
import { createAnalysis, getAnalysis, listAnalyses } from '../services/analyses.service';
import { applyStoredAnalysis } from '../services/analysis-apply.service';

const analysisIdParamSchema = idParam('analysis');

/** Analyses of a table's logs, their kept samples, and applying one as a new revision. */
export function analysisRoutes(ctx: AppContext): Router {
  const router = Router();

  router.post(
    '/tables/:id/analyses',
    requireRoles('tuner'),
    ...handle(
      { params: tableIdParamSchema, body: createAnalysisRequestSchema },
      async ({ params, body }, req, res) => {
        res.status(201).json(await createAnalysis(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  router.get(
    '/tables/:id/analyses',
    requireSignedIn,
    ...handle(
      { params: tableIdParamSchema, query: listAnalysesQuerySchema },
      async ({ params, query }, req, res) => {
        res.json(await listAnalyses(ctx.db, currentUser(req), params.id, query));
      },
    ),
  );

  router.get(
    '/analyses/:id/samples',
    requireSignedIn,
    ...handle(
      { params: analysisIdParamSchema, query: analysisSamplesQuerySchema },
      async ({ params, query }, req, res) => {
        res.json(await analysisSamples(ctx.db, currentUser(req), params.id, query));
      },
    ),
  );

  router.get(
    '/analyses/:id',
    requireSignedIn,
    ...handle({ params: analysisIdParamSchema }, async ({ params }, req, res) => {
      res.json(await getAnalysis(ctx.db, currentUser(req), params.id));
    }),
  );

  router.post(
    '/analyses/:id/apply',
    requireRoles('tuner'),
    ...handle(
      { params: analysisIdParamSchema, body: applyAnalysisRequestSchema },
      async ({ params, body }, req, res) => {
        res.status(201).json(await applyStoredAnalysis(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  return router;
}

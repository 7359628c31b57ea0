import { Router } from 'express';
import {
  applyAnalysisRequestSchema,
  createAnalysisRequestSchema,
  type ApplyAnalysisRequest,
  type CreateAnalysisRequest,
} from '../../shared/contracts/analyses';
import { idParamSchema } from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { validate, validated } from '../middleware/validate';
import { applyStoredAnalysis, createAnalysis, getAnalysis } from '../services/analyses.service';

/** Analyses of a table's logs, and applying one as a new revision. */
export function analysisRoutes(ctx: AppContext): Router {
  const router = Router();

  router.post(
    '/tables/:id/analyses',
    requireRoles('tuner'),
    validate({ params: idParamSchema, body: createAnalysisRequestSchema }),
    async (req, res) => {
      const { params, body } = validated<CreateAnalysisRequest, unknown, { id: string }>(res);
      res.status(201).json(await createAnalysis(ctx.db, currentUser(req), params.id, body));
    },
  );

  router.get(
    '/analyses/:id',
    requireSignedIn,
    validate({ params: idParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, { id: string }>(res);
      res.json(await getAnalysis(ctx.db, currentUser(req), params.id));
    },
  );

  router.post(
    '/analyses/:id/apply',
    requireRoles('tuner'),
    validate({ params: idParamSchema, body: applyAnalysisRequestSchema }),
    async (req, res) => {
      const { params, body } = validated<ApplyAnalysisRequest, unknown, { id: string }>(res);
      res.status(201).json(await applyStoredAnalysis(ctx.db, currentUser(req), params.id, body));
    },
  );

  return router;
}

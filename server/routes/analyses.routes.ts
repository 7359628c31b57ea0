import { Router } from 'express';
import {
  analysisSamplesQuerySchema,
  applyAnalysisRequestSchema,
  createAnalysisRequestSchema,
  listAnalysesQuerySchema,
  type AnalysisSamplesQuery,
  type ApplyAnalysisRequest,
  type CreateAnalysisRequest,
  type ListAnalysesQuery,
} from '../../shared/contracts/analyses';
import { idParamSchema } from '../../shared/contracts/team';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { validate, validated } from '../middleware/validate';
import { analysisSamples } from '../services/analysis-samples';
import { createAnalysis, getAnalysis, listAnalyses } from '../services/analyses.service';
import { applyStoredAnalysis } from '../services/analysis-apply.service';

/** Analyses of a table's logs, their kept samples, and applying one as a new revision. */
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
    '/tables/:id/analyses',
    requireSignedIn,
    validate({ params: idParamSchema, query: listAnalysesQuerySchema }),
    async (req, res) => {
      const { params, query } = validated<unknown, ListAnalysesQuery, { id: string }>(res);
      res.json(await listAnalyses(ctx.db, currentUser(req), params.id, query));
    },
  );

  router.get(
    '/analyses/:id/samples',
    requireSignedIn,
    validate({ params: idParamSchema, query: analysisSamplesQuerySchema }),
    async (req, res) => {
      const { params, query } = validated<unknown, AnalysisSamplesQuery, { id: string }>(res);
      res.json(await analysisSamples(ctx.db, currentUser(req), params.id, query));
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

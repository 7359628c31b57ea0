import { Router } from 'express';
import {
  logIdParamSchema,
  logSeriesQuerySchema,
  logVehicleParamSchema,
  mappingPresetListQuerySchema,
  mappingPresetParamSchema,
  updateLogRequestSchema,
  uploadLogFieldsSchema,
} from '../../shared/contracts/logs';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { receiveLogUpload } from '../middleware/log-upload';
import { handle } from '../middleware/validate';
import { receivedFileOf } from '../services/log-storage.service';
import { getLogSeries } from '../services/log-series';
import { changeLog, deleteLog } from '../services/log-changes.service';
import { uploadLog } from '../services/log-upload.service';
import { getLog, listVehicleLogs, requireVehicle } from '../services/logs.service';
import { getMappingPreset, listMappingPresets } from '../services/mapping-presets.service';

/**
 * Log routes: upload (multipart, parsed in the background), one log, a vehicle's logs, a log's
 * bucketed series for the chart, and the shop's saved column mappings.
 */
export function logRoutes(ctx: AppContext): Router {
  const router = Router();

  router.post(
    '/vehicles/:id/logs',
    requireRoles('tuner', 'operator'),
    // Before reading the file: another shop's vehicle is refused without receiving it.
    ...handle({ params: logVehicleParamSchema }, async ({ params }, req, _res, next) => {
      await requireVehicle(ctx.db, currentUser(req), params.id);
      next();
    }),
    receiveLogUpload(ctx.config),
    // The text fields exist only now; `validate` replaces what it parsed, so params go again.
    ...handle(
      { params: logVehicleParamSchema, body: uploadLogFieldsSchema },
      async ({ params, body }, req, res) => {
        const file = receivedFileOf(req.file);
        res.status(202).json(await uploadLog(ctx, currentUser(req), params.id, body, file));
      },
    ),
  );

  router.get(
    '/vehicles/:id/logs',
    requireSignedIn,
    ...handle({ params: logVehicleParamSchema }, async ({ params }, req, res) => {
      const items = await listVehicleLogs(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    }),
  );

  router.get(
    '/logs/:id',
    requireSignedIn,
    ...handle({ params: logIdParamSchema }, async ({ params }, req, res) => {
      res.json(await getLog(ctx.db, currentUser(req), params.id));
    }),
  );

  router.patch(
    '/logs/:id',
    requireRoles('tuner', 'operator'),
    ...handle(
      { params: logIdParamSchema, body: updateLogRequestSchema },
      async ({ params, body }, req, res) => {
        res.json(await changeLog(ctx, currentUser(req), params.id, body));
      },
    ),
  );

  router.delete(
    '/logs/:id',
    requireRoles('tuner', 'admin'),
    ...handle({ params: logIdParamSchema }, async ({ params }, req, res) => {
      await deleteLog(ctx, currentUser(req), params.id);
      res.status(204).end();
    }),
  );

  router.get(
    '/logs/:id/series',
    requireSignedIn,
    ...handle(
      { params: logIdParamSchema, query: logSeriesQuerySchema },
      async ({ params, query }, req, res) => {
        res.json(await getLogSeries(ctx.db, currentUser(req), params.id, query));
      },
    ),
  );

  router.get(
    '/mapping-presets',
    requireSignedIn,
    ...handle({ query: mappingPresetListQuerySchema }, async ({ query }, req, res) => {
      const items = await listMappingPresets(ctx.db, currentUser(req), query.signature);
      res.json({ items, total: items.length });
    }),
  );

  router.get(
    '/mapping-presets/:signature',
    requireSignedIn,
    ...handle({ params: mappingPresetParamSchema }, async ({ params }, req, res) => {
      res.json(await getMappingPreset(ctx.db, currentUser(req), params.signature));
    }),
  );

  return router;
}

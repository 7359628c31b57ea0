import { Router } from 'express';
import {
  logIdParamSchema,
  logSeriesQuerySchema,
  logVehicleParamSchema,
  mappingPresetListQuerySchema,
  mappingPresetParamSchema,
  uploadLogFieldsSchema,
  type LogSeriesQuery,
  type MappingPresetListQuery,
  type UploadLogFields,
} from '../../shared/contracts/logs';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { receiveLogUpload } from '../middleware/log-upload';
import { validate, validated } from '../middleware/validate';
import { receivedFileOf } from '../services/log-storage.service';
import { getLogSeries } from '../services/log-series';
import {
  getLog,
  getMappingPreset,
  listMappingPresets,
  listVehicleLogs,
  requireVehicle,
  uploadLog,
} from '../services/logs.service';

type IdParams = { id: string };

/**
 * Log routes: upload (multipart, parsed in the background), one log, a vehicle's logs, a log's
 * bucketed series for the chart, and the shop's saved column mappings.
 */
export function logRoutes(ctx: AppContext): Router {
  const router = Router();

  router.post(
    '/vehicles/:id/logs',
    requireRoles('tuner', 'operator'),
    validate({ params: logVehicleParamSchema }),
    // Before reading the file: another shop's vehicle is refused without receiving it.
    async (req, res, next) => {
      await requireVehicle(
        ctx.db,
        currentUser(req),
        validated<unknown, unknown, IdParams>(res).params.id,
      );
      next();
    },
    receiveLogUpload(ctx.config),
    // The text fields exist only now; `validate` replaces what it parsed, so params go again.
    validate({ params: logVehicleParamSchema, body: uploadLogFieldsSchema }),
    async (req, res) => {
      const { params, body } = validated<UploadLogFields, unknown, IdParams>(res);
      const file = receivedFileOf(req.file);
      res.status(202).json(await uploadLog(ctx, currentUser(req), params.id, body, file));
    },
  );

  router.get(
    '/vehicles/:id/logs',
    requireSignedIn,
    validate({ params: logVehicleParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, IdParams>(res);
      const items = await listVehicleLogs(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    },
  );

  router.get(
    '/logs/:id',
    requireSignedIn,
    validate({ params: logIdParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, IdParams>(res);
      res.json(await getLog(ctx.db, currentUser(req), params.id));
    },
  );

  router.get(
    '/logs/:id/series',
    requireSignedIn,
    validate({ params: logIdParamSchema, query: logSeriesQuerySchema }),
    async (req, res) => {
      const { params, query } = validated<unknown, LogSeriesQuery, IdParams>(res);
      res.json(await getLogSeries(ctx.db, currentUser(req), params.id, query));
    },
  );

  router.get(
    '/mapping-presets',
    requireSignedIn,
    validate({ query: mappingPresetListQuerySchema }),
    async (req, res) => {
      const { query } = validated<unknown, MappingPresetListQuery>(res);
      const items = await listMappingPresets(ctx.db, currentUser(req), query.signature);
      res.json({ items, total: items.length });
    },
  );

  router.get(
    '/mapping-presets/:signature',
    requireSignedIn,
    validate({ params: mappingPresetParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, { signature: string }>(res);
      res.json(await getMappingPreset(ctx.db, currentUser(req), params.signature));
    },
  );

  return router;
}

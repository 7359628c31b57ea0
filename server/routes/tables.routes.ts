import { Router } from 'express';
import {
  createRevisionRequestSchema,
  createTableRequestSchema,
  tableIdParamSchema,
  type CreateRevisionRequest,
  type CreateTableRequest,
  type IdParams,
} from '../../shared/contracts/tables';
import { vehicleIdParamSchema, type VehicleIdParams } from '../../shared/contracts/vehicles';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { validate, validated } from '../middleware/validate';
import { addRevision } from '../services/revisions.service';
import {
  createTable,
  getTable,
  listTableRevisions,
  listVehicleTables,
} from '../services/tables.service';

/** VE tables of a vehicle and their revisions: every member reads, tuners write. */
export function tableRoutes(ctx: AppContext): Router {
  const router = Router();

  router.get(
    '/vehicles/:id/tables',
    requireSignedIn,
    validate({ params: vehicleIdParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, VehicleIdParams>(res);
      const items = await listVehicleTables(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    },
  );

  router.post(
    '/vehicles/:id/tables',
    requireRoles('tuner'),
    validate({ params: vehicleIdParamSchema, body: createTableRequestSchema }),
    async (req, res) => {
      const { params, body } = validated<CreateTableRequest, unknown, VehicleIdParams>(res);
      res.status(201).json(await createTable(ctx.db, currentUser(req), params.id, body));
    },
  );

  router.get(
    '/tables/:id',
    requireSignedIn,
    validate({ params: tableIdParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, IdParams>(res);
      res.json(await getTable(ctx.db, currentUser(req), params.id));
    },
  );

  router.get(
    '/tables/:id/revisions',
    requireSignedIn,
    validate({ params: tableIdParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, IdParams>(res);
      const items = await listTableRevisions(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    },
  );

  router.post(
    '/tables/:id/revisions',
    requireRoles('tuner'),
    validate({ params: tableIdParamSchema, body: createRevisionRequestSchema }),
    async (req, res) => {
      const { params, body } = validated<CreateRevisionRequest, unknown, IdParams>(res);
      res.status(201).json(await addRevision(ctx.db, currentUser(req), params.id, body));
    },
  );

  return router;
}

import { Router } from 'express';
import {
  createRevisionRequestSchema,
  createTableRequestSchema,
  tableIdParamSchema,
} from '../../shared/contracts/tables';
import { vehicleIdParamSchema } from '../../shared/contracts/vehicles';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { handle } from '../middleware/validate';
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
    ...handle({ params: vehicleIdParamSchema }, async ({ params }, req, res) => {
      const items = await listVehicleTables(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    }),
  );

  router.post(
    '/vehicles/:id/tables',
    requireRoles('tuner'),
    ...handle(
      { params: vehicleIdParamSchema, body: createTableRequestSchema },
      async ({ params, body }, req, res) => {
        res.status(201).json(await createTable(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  router.get(
    '/tables/:id',
    requireSignedIn,
    ...handle({ params: tableIdParamSchema }, async ({ params }, req, res) => {
      res.json(await getTable(ctx.db, currentUser(req), params.id));
    }),
  );

  router.get(
    '/tables/:id/revisions',
    requireSignedIn,
    ...handle({ params: tableIdParamSchema }, async ({ params }, req, res) => {
      const items = await listTableRevisions(ctx.db, currentUser(req), params.id);
      res.json({ items, total: items.length });
    }),
  );

  router.post(
    '/tables/:id/revisions',
    requireRoles('tuner'),
    ...handle(
      { params: tableIdParamSchema, body: createRevisionRequestSchema },
      async ({ params, body }, req, res) => {
        res.status(201).json(await addRevision(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  return router;
}

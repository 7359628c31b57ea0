import { Router } from 'express';
import {
  createVehicleRequestSchema,
  listVehiclesQuerySchema,
  updateVehicleRequestSchema,
  vehicleIdParamSchema,
} from '../../shared/contracts/vehicles';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { handle } from '../middleware/validate';
import {
  addVehicle,
  changeVehicle,
  getVehicle,
  listShopVehicles,
} from '../services/vehicles.service';

/** Vehicles of the signed-in user's shop: every member reads, tuners and admins write. */
export function vehicleRoutes(ctx: AppContext): Router {
  const router = Router();
  const canWrite = requireRoles('tuner', 'admin');

  router.get(
    '/vehicles',
    requireSignedIn,
    ...handle({ query: listVehiclesQuerySchema }, async ({ query }, req, res) => {
      res.json(await listShopVehicles(ctx.db, currentUser(req), query));
    }),
  );

  router.post(
    '/vehicles',
    canWrite,
    ...handle({ body: createVehicleRequestSchema }, async ({ body }, req, res) => {
      res.status(201).json(await addVehicle(ctx.db, currentUser(req), body));
    }),
  );

  router.get(
    '/vehicles/:id',
    requireSignedIn,
    ...handle({ params: vehicleIdParamSchema }, async ({ params }, req, res) => {
      res.json(await getVehicle(ctx.db, currentUser(req), params.id));
    }),
  );

  router.patch(
    '/vehicles/:id',
    canWrite,
    ...handle(
      { params: vehicleIdParamSchema, body: updateVehicleRequestSchema },
      async ({ params, body }, req, res) => {
        res.json(await changeVehicle(ctx.db, currentUser(req), params.id, body));
      },
    ),
  );

  return router;
}

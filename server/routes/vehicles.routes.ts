import { Router } from 'express';
import {
  createVehicleRequestSchema,
  listVehiclesQuerySchema,
  updateVehicleRequestSchema,
  vehicleIdParamSchema,
  type CreateVehicleRequest,
  type ListVehiclesQuery,
  type UpdateVehicleRequest,
  type VehicleIdParams,
} from '../../shared/contracts/vehicles';
import type { AppContext } from '../context';
import { currentUser, requireRoles, requireSignedIn } from '../middleware/auth';
import { validate, validated } from '../middleware/validate';
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
    validate({ query: listVehiclesQuerySchema }),
    async (req, res) => {
      const { query } = validated<unknown, ListVehiclesQuery>(res);
      res.json(await listShopVehicles(ctx.db, currentUser(req), query));
    },
  );

  router.post(
    '/vehicles',
    canWrite,
    validate({ body: createVehicleRequestSchema }),
    async (req, res) => {
      const { body } = validated<CreateVehicleRequest>(res);
      res.status(201).json(await addVehicle(ctx.db, currentUser(req), body));
    },
  );

  router.get(
    '/vehicles/:id',
    requireSignedIn,
    validate({ params: vehicleIdParamSchema }),
    async (req, res) => {
      const { params } = validated<unknown, unknown, VehicleIdParams>(res);
      res.json(await getVehicle(ctx.db, currentUser(req), params.id));
    },
  );

  router.patch(
    '/vehicles/:id',
    canWrite,
    validate({ params: vehicleIdParamSchema, body: updateVehicleRequestSchema }),
    async (req, res) => {
      const { params, body } = validated<UpdateVehicleRequest, unknown, VehicleIdParams>(res);
      res.json(await changeVehicle(ctx.db, currentUser(req), params.id, body));
    },
  );

  return router;
}

import type { ListResponse } from '../../shared/contracts/errors';
import {
  engineInputSchema,
  type CreateVehicleRequest,
  type ListVehiclesQuery,
  type UpdateVehicleRequest,
  type Vehicle,
  type VehicleEngine,
} from '../../shared/contracts/vehicles';
import type { Database } from '../db';
import { notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import { recordAudit } from '../repositories/audit.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import {
  findVehicle,
  insertVehicle,
  listVehicles,
  updateVehicle,
} from '../repositories/vehicles.repository';

/** A page of the actor's shop's vehicles, searched and sorted as asked. */
export function listShopVehicles(
  db: Database,
  actor: SessionUserRecord,
  query: ListVehiclesQuery,
): Promise<ListResponse<Vehicle>> {
  return listVehicles(db, actor.shopId, query);
}

/** One vehicle of the actor's shop; 404 when it is not there. */
export async function getVehicle(
  db: Database,
  actor: SessionUserRecord,
  id: string,
): Promise<Vehicle> {
  const vehicle = await findVehicle(db, actor.shopId, id);
  if (!vehicle) throw notFound('Vehicle');
  return vehicle;
}

/** Adds a vehicle to the actor's shop. */
export function addVehicle(
  db: Database,
  actor: SessionUserRecord,
  body: CreateVehicleRequest,
): Promise<Vehicle> {
  return db.transaction(async (tx) => {
    const vehicle = await insertVehicle(tx, actor.shopId, body);
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'vehicle.created',
      targetType: 'vehicle',
      targetId: vehicle.id,
      details: { label: vehicle.label },
    });
    return vehicle;
  });
}

/**
 * The stored engine with a partial change laid over it. A new fuel given without a
 * stoichiometric AFR takes that fuel's own value (keeping the old fuel's would silently make
 * every AFR conversion wrong); `custom` then needs one, and the merged engine is checked again.
 */
function mergeEngine(stored: VehicleEngine, change: UpdateVehicleRequest['engine']): VehicleEngine {
  if (!change) return stored;
  const isFuelChanged = change.fuel !== undefined && change.fuel !== stored.fuel;
  const merged = {
    displacementL: change.displacementL ?? stored.displacementL,
    cylinders: change.cylinders ?? stored.cylinders,
    fuel: change.fuel ?? stored.fuel,
    stoichAfr: change.stoichAfr ?? (isFuelChanged ? undefined : stored.stoichAfr),
    injectorCcMin: change.injectorCcMin ?? stored.injectorCcMin,
  };
  const parsed = engineInputSchema.safeParse(merged);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw invalidInput(
      ['body', 'engine', ...(issue?.path ?? []).map(String)].join('.'),
      issue?.message ?? 'the engine is incomplete',
    );
  }
  return parsed.data;
}

/** Changes some fields of a vehicle of the actor's shop; 404 when it is not there. */
export function changeVehicle(
  db: Database,
  actor: SessionUserRecord,
  id: string,
  change: UpdateVehicleRequest,
): Promise<Vehicle> {
  return db.transaction(async (tx) => {
    const stored = await findVehicle(tx, actor.shopId, id, { forUpdate: true });
    if (!stored) throw notFound('Vehicle');
    const updated = await updateVehicle(tx, actor.shopId, id, {
      label: change.label ?? stored.label,
      description: change.description ?? stored.description,
      engine: mergeEngine(stored.engine, change.engine),
      gearing: { ...stored.gearing, ...change.gearing },
      fuelSafety: { ...stored.fuelSafety, ...change.fuelSafety },
    });
    if (!updated) throw notFound('Vehicle');
    await recordAudit(tx, {
      shopId: actor.shopId,
      actorId: actor.id,
      action: 'vehicle.changed',
      targetType: 'vehicle',
      targetId: id,
      details: { before: stored, change },
    });
    return updated;
  });
}

import { and, asc, count, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import { vehicles, type VehicleRow } from '../../db/schema';
import type {
  ListVehiclesQuery,
  Vehicle,
  VehicleEngine,
  VehicleFuelSafety,
  VehicleGearing,
} from '../../shared/contracts/vehicles';
import type { Fuel } from '../../shared/units/fuels';
import type { Executor } from '../db';

/** What a vehicle is made of, without id and timestamps. */
export interface VehicleFields {
  /** Short name shown in lists. */
  label: string;
  /** Free notes. */
  description: string;
  /** Engine facts. */
  engine: VehicleEngine;
  /** Gearing facts. */
  gearing: VehicleGearing;
  /** The fuel-safety guard's settings. */
  fuelSafety: VehicleFuelSafety;
}

function toVehicle(row: VehicleRow): Vehicle {
  return {
    id: row.id,
    label: row.label,
    description: row.description,
    engine: {
      displacementL: row.displacementL,
      cylinders: row.cylinders,
      // Only values the contract accepted are ever written.
      fuel: row.fuel as Fuel,
      stoichAfr: row.stoichAfr,
      injectorCcMin: row.injectorCcMin,
    },
    gearing: {
      tireDiameterMm: row.tireDiameterMm,
      gearRatios: row.gearRatios,
      finalDrive: row.finalDrive,
    },
    fuelSafety: {
      loadLinePercentOfBaro: row.loadLinePercentOfBaro,
      leanAllowancePercent: row.leanAllowancePercent,
    },
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function toColumns(fields: VehicleFields) {
  return {
    label: fields.label,
    description: fields.description,
    displacementL: fields.engine.displacementL,
    cylinders: fields.engine.cylinders,
    fuel: fields.engine.fuel,
    stoichAfr: fields.engine.stoichAfr,
    injectorCcMin: fields.engine.injectorCcMin,
    tireDiameterMm: fields.gearing.tireDiameterMm,
    gearRatios: fields.gearing.gearRatios,
    finalDrive: fields.gearing.finalDrive,
    loadLinePercentOfBaro: fields.fuelSafety.loadLinePercentOfBaro,
    leanAllowancePercent: fields.fuelSafety.leanAllowancePercent,
  };
}

/** Stores a new vehicle of a shop. */
export async function insertVehicle(
  db: Executor,
  shopId: string,
  fields: VehicleFields,
): Promise<Vehicle> {
  const [row] = await db
    .insert(vehicles)
    .values({ shopId, ...toColumns(fields) })
    .returning();
  if (!row) throw new Error('insertVehicle: no row returned');
  return toVehicle(row);
}

/**
 * One vehicle of a shop, or null when there is none with this id in that shop. With
 * `forUpdate` (inside a transaction) the row stays locked until it ends, so two partial
 * updates merged from the same stored state cannot overwrite each other.
 */
export async function findVehicle(
  db: Executor,
  shopId: string,
  id: string,
  options: { forUpdate?: boolean } = {},
): Promise<Vehicle | null> {
  const query = db
    .select()
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, id)))
    .limit(1);
  const [row] = options.forUpdate ? await query.for('update') : await query;
  return row ? toVehicle(row) : null;
}

/** `text` as a LIKE pattern matching it anywhere, with LIKE's own wildcards taken literally. */
function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`;
}

/** A page of a shop's vehicles, searched and sorted, and how many match in all. */
export async function listVehicles(
  db: Executor,
  shopId: string,
  query: ListVehiclesQuery,
): Promise<{ items: Vehicle[]; total: number }> {
  const conditions: SQL[] = [eq(vehicles.shopId, shopId)];
  if (query.q) {
    const pattern = containsPattern(query.q);
    const match = or(ilike(vehicles.label, pattern), ilike(vehicles.description, pattern));
    if (match) conditions.push(match);
  }
  const where = and(...conditions);
  const direction = query.order === 'desc' ? desc : asc;
  // Labels sort without regard to case; the id breaks ties so pages never overlap.
  const key = query.sort === 'label' ? sql`lower(${vehicles.label})` : vehicles.createdAt;
  const rows = await db
    .select()
    .from(vehicles)
    .where(where)
    .orderBy(direction(key), direction(vehicles.id))
    .limit(query.limit)
    .offset(query.offset);
  const [counted] = await db.select({ total: count() }).from(vehicles).where(where);
  return { items: rows.map(toVehicle), total: counted?.total ?? 0 };
}

/** Replaces a shop's vehicle's fields; returns it, or null when it is not in that shop. */
export async function updateVehicle(
  db: Executor,
  shopId: string,
  id: string,
  fields: VehicleFields,
): Promise<Vehicle | null> {
  const [row] = await db
    .update(vehicles)
    .set({ ...toColumns(fields), updatedAt: new Date() })
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, id)))
    .returning();
  return row ? toVehicle(row) : null;
}

/** What parsing needs to know about a vehicle. */
export interface VehicleFacts {
  /** The vehicle's id. */
  id: string;
  /** The fuel's stoichiometric AFR, to turn AFR columns into lambda. */
  stoichAfr: number;
  /** Engine displacement, litres: the airflow behind the wideband delay. */
  displacementL: number;
}

/** A vehicle of a shop with the facts parsing needs, or null when it is not in that shop. */
export async function findVehicleFacts(
  db: Executor,
  shopId: string,
  vehicleId: string,
): Promise<VehicleFacts | null> {
  const [row] = await db
    .select({
      id: vehicles.id,
      stoichAfr: vehicles.stoichAfr,
      displacementL: vehicles.displacementL,
    })
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.id, vehicleId)))
    .limit(1);
  return row ?? null;
}

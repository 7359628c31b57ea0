import type { AppliedGuard, Revision } from '../../shared/contracts/tables';
import type { Vehicle } from '../../shared/contracts/vehicles';
import type { VeTable } from '../../shared/core/table';
import { STANDARD_BARO_KPA } from '../../shared/correct';
import type { BaroEstimate } from '../../shared/pipeline';
import type { Database } from '../db';
import { notFound } from '../errors/app-error';
import { findTable } from '../repositories/tables.repository';
import type { StoredAnalysis } from '../repositories/stored-analysis';
import { findVehicle } from '../repositories/vehicles.repository';

// What an analysis needs from around it: its vehicle, the fuel-safety guard on that vehicle, and
// the table of a revision. Shared by running, reading and applying analyses.

/** The barometric pressure an analysis stored; analyses from before it was kept assume ISA. */
export function storedBaro(row: StoredAnalysis): BaroEstimate {
  const baro = row.filterReport.baro;
  return baro && baro.kpa > 0 ? baro : { kpa: STANDARD_BARO_KPA, source: 'assumed' };
}

/** The guard of an analysis on a vehicle: the vehicle's settings over the logs' pressure. */
export function analysisGuard(row: StoredAnalysis, vehicle: Vehicle): AppliedGuard {
  const baro = storedBaro(row);
  const { loadLinePercentOfBaro, leanAllowancePercent } = vehicle.fuelSafety;
  return {
    loadLineKpa: Math.round(baro.kpa * loadLinePercentOfBaro) / 100,
    loadLinePercentOfBaro,
    leanAllowancePercent,
    baroKpa: baro.kpa,
    baroSource: baro.source,
  };
}

/** The vehicle an analysis's table belongs to. */
export async function vehicleOfTable(
  db: Database,
  shopId: string,
  tableId: string,
): Promise<Vehicle> {
  const table = await findTable(db, shopId, tableId);
  if (!table) throw notFound('Table');
  const vehicle = await findVehicle(db, shopId, table.vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  return vehicle;
}

/** The table of a revision as a VeTable, its axes from the revision's own table. */
export async function revisionTable(
  db: Database,
  shopId: string,
  revision: Revision,
): Promise<VeTable> {
  const table = await findTable(db, shopId, revision.tableId);
  if (!table) throw notFound('Table');
  return { rpmAxis: table.rpmAxis, mapAxisKpa: table.mapAxisKpa, values: revision.values };
}

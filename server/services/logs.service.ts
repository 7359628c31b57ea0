import type { ColumnarLog, Channel } from '../../shared/core/channels';
import { type BeyondTable, type LogResource } from '../../shared/contracts/logs';
import type { VeTableResource } from '../../shared/contracts/tables';
import { isChannel, shareAbove } from '../../shared/import';
import type { Database } from '../db';
import { conflict, notFound } from '../errors/app-error';
import { findLog, listLogsOfVehicle, readLogChannels } from '../repositories/logs.repository';
import { listTablesOfVehicle } from '../repositories/tables.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { findVehicleFacts, type VehicleFacts } from '../repositories/vehicles.repository';
import { decodeChannel } from './channel-codec';

/** A vehicle of the user's shop with what parsing needs; 404 when it is not in their shop. */
export async function requireVehicle(
  db: Database,
  user: SessionUserRecord,
  vehicleId: string,
): Promise<VehicleFacts> {
  const vehicle = await findVehicleFacts(db, user.shopId, vehicleId);
  if (!vehicle) throw notFound('Vehicle');
  return vehicle;
}

/** One log of the user's shop; 404 when it is not in their shop. */
export async function getLog(
  db: Database,
  user: SessionUserRecord,
  logId: string,
): Promise<LogResource> {
  const log = await findLog(db, user.shopId, logId);
  if (!log) throw notFound('Log');
  const tables = await listTablesOfVehicle(db, user.shopId, log.vehicleId);
  return { ...log, beyondTables: beyondTables(log, tables) };
}

/** The tables a parsed log runs past the top of, with the share of its samples beyond. */
function beyondTables(log: LogResource, tables: readonly VeTableResource[]): BeyondTable[] {
  const rpm = log.channelSummary?.rpm;
  const map = log.channelSummary?.map;
  if (!rpm || !map || rpm.max === null || map.max === null) return [];
  const out: BeyondTable[] = [];
  for (const table of tables) {
    const rpmTop = table.rpmAxis[table.rpmAxis.length - 1] as number;
    const mapTopKpa = table.mapAxisKpa[table.mapAxisKpa.length - 1] as number;
    if (!(rpm.max > rpmTop) && !(map.max > mapTopKpa)) continue;
    out.push({
      tableId: table.id,
      tableName: table.name,
      rpmTop,
      logRpmMax: rpm.max,
      mapTopKpa,
      logMapMaxKpa: map.max,
      shareAboveRpm: rpm.permille ? shareAbove(rpm.permille, rpmTop) : null,
      shareAboveMap: map.permille ? shareAbove(map.permille, mapTopKpa) : null,
    });
  }
  return out;
}

/** The logs of a vehicle of the user's shop, newest first; 404 when the vehicle is not theirs. */
export async function listVehicleLogs(
  db: Database,
  user: SessionUserRecord,
  vehicleId: string,
): Promise<LogResource[]> {
  await requireVehicle(db, user, vehicleId);
  return listLogsOfVehicle(db, user.shopId, vehicleId);
}

/**
 * A parsed log's samples as a ColumnarLog (canonical units), for the analysis. 404 when the
 * log is not in the shop, 409 (with `status`) when it is not parsed yet or failed.
 */
export async function loadLogChannels(
  db: Database,
  shopId: string,
  logId: string,
): Promise<ColumnarLog> {
  const log = await findLog(db, shopId, logId);
  if (!log) throw notFound('Log');
  if (log.status !== 'ready' || log.sampleCount === null) {
    throw conflict(`Log ${logId} is ${log.status}, not ready`, { logId, status: log.status });
  }
  const channels: Partial<Record<Channel, Float64Array>> = {};
  for (const row of await readLogChannels(db, shopId, logId)) {
    if (!isChannel(row.channel)) continue;
    channels[row.channel] = await decodeChannel(row.data, row.encoding, row.sampleCount);
  }
  return { length: log.sampleCount, channels };
}

import { requireChannel, type ColumnarLog } from '../../shared/core/channels';
import type { VeTable } from '../../shared/core/table';
import type {
  FunnelLine,
  LogSeries,
  LogSeriesQuery,
  SeriesEnvelope,
} from '../../shared/contracts/logs';
import { prepareLog } from '../../shared/pipeline';
import { bucketSeries, seriesWindow, type ChannelEnvelope } from '../../shared/series';
import type { Database } from '../db';
import { conflict, notFound } from '../errors/app-error';
import { invalidInput } from '../errors/invalid-input';
import { findLog } from '../repositories/logs.repository';
import {
  findFirstTableHead,
  findRevisionTable,
  type RevisionTable,
} from '../repositories/revisions.repository';
import { findVehicleFacts } from '../repositories/vehicles.repository';
import type { SessionUserRecord } from '../repositories/users.repository';
import { loadLogChannels } from './logs.service';

/** The default filter's verdict on a log, as an analysis with no settings would reach it. */
export interface DefaultFilterView {
  /** 1 for each sample kept, 0 for each removed. */
  readonly keep: Uint8Array;
  /** What each rule removed, in order. */
  readonly funnel: readonly FunnelLine[];
  /** The wideband delay applied before the rules ran. */
  readonly delayUsed: NonNullable<LogSeries['delayUsed']>;
}

/**
 * The first half of an analysis with no settings (`prepareLog` of shared/pipeline, as
 * `analyseLogs` runs it) on one log: its keep mask, funnel and the delay used.
 */
export function defaultFilterView(
  log: ColumnarLog,
  ecuTable: VeTable,
  displacementL: number,
): DefaultFilterView {
  const { keep, funnel, delayUsed } = prepareLog(log, { ecuTable, displacementL });
  return { keep, funnel, delayUsed };
}

/** What a log's series is drawn from: its channels and the default filter's verdict. */
interface PreparedLog {
  readonly log: ColumnarLog;
  readonly revisionId: string | null;
  readonly view: DefaultFilterView | null;
}

/**
 * The last few logs prepared, so zooming (one request per settled zoom) does not decode the
 * channels and rerun the filter each time. Keyed by shop, log, its last change and the table
 * revision used; a small count bounds the memory.
 */
const prepared = new Map<string, PreparedLog>();
const PREPARED_KEPT = 4;

function remember(key: string, value: PreparedLog): void {
  prepared.delete(key);
  prepared.set(key, value);
  while (prepared.size > PREPARED_KEPT) prepared.delete(prepared.keys().next().value as string);
}

/** The VE table the log's ECU ran: its recorded revision, else the vehicle's first table's head. */
async function tableForLog(
  db: Database,
  shopId: string,
  vehicleId: string,
  ecuRevisionId: string | null,
): Promise<RevisionTable | null> {
  const recorded = ecuRevisionId ? await findRevisionTable(db, shopId, ecuRevisionId) : null;
  return recorded ?? findFirstTableHead(db, shopId, vehicleId);
}

/** Rounds to `digits` decimals, keeping null (the JSON stays small and readable). */
function rounded(values: (number | null)[], digits: number): (number | null)[] {
  const scale = 10 ** digits;
  return values.map((v) => (v === null ? null : Math.round(v * scale) / scale));
}

function envelope(env: ChannelEnvelope, digits: number): SeriesEnvelope {
  return {
    min: rounded(env.min, digits),
    max: rounded(env.max, digits),
    mean: rounded(env.mean, digits),
  };
}

/**
 * A window of a parsed log bucketed for a chart (min/max/mean per bucket), with the share of
 * each bucket the default filter keeps, the filter's funnel and the delay used. The filter needs
 * the VE the ECU ran (for the airflow behind the wideband delay): the log's ECU revision, else
 * the head of the vehicle's first table; without any table `kept`, `funnel` and `delayUsed` are
 * null. 404 when the log is not in the shop, 409 when it is not ready, 400 naming `fromS`/`toS`
 * when the window misses the log.
 */
export async function getLogSeries(
  db: Database,
  user: SessionUserRecord,
  logId: string,
  query: LogSeriesQuery,
): Promise<LogSeries> {
  const { shopId } = user;
  const record = await findLog(db, shopId, logId);
  if (!record) throw notFound('Log');
  if (record.status !== 'ready') {
    throw conflict(`Log ${logId} is ${record.status}, not ready`, {
      logId,
      status: record.status,
    });
  }
  const table = await tableForLog(db, shopId, record.vehicleId, record.ecuRevisionId);
  const key = [shopId, logId, record.updatedAt, table?.revisionId ?? '-'].join(':');
  let ready = prepared.get(key);
  if (!ready) {
    const log = await loadLogChannels(db, shopId, logId);
    const vehicle = await findVehicleFacts(db, shopId, record.vehicleId);
    if (!vehicle) throw notFound('Vehicle');
    const view = table ? defaultFilterView(log, table, vehicle.displacementL) : null;
    ready = { log, revisionId: table?.revisionId ?? null, view };
  }
  remember(key, ready);

  const { log, view } = ready;
  const time = requireChannel(log, 'time');
  if (seriesWindow(time, query.fromS, query.toS) === null) {
    const firstS = time[0] ?? 0;
    const lastS = time[time.length - 1] ?? 0;
    throw invalidInput(
      query.fromS !== undefined && query.fromS > lastS ? 'query.fromS' : 'query.toS',
      `the window lies outside the log, which runs from ${firstS} s to ${lastS} s`,
    );
  }
  const channels: Record<string, Float64Array> = {
    rpm: requireChannel(log, 'rpm'),
    mapKpa: requireChannel(log, 'map'),
    lambda: requireChannel(log, 'lambda'),
    lambdaTarget: requireChannel(log, 'lambdaTarget'),
  };
  if (log.channels.tps) channels['throttlePct'] = log.channels.tps;
  const series = bucketSeries(
    { time, channels, keep: view?.keep ?? null },
    { points: query.points, fromS: query.fromS, toS: query.toS },
  );
  const out = (name: string, digits: number) => envelope(series.channels[name], digits);
  return {
    timeS: rounded(series.timeS, 4) as number[],
    channels: {
      rpm: out('rpm', 1),
      mapKpa: out('mapKpa', 2),
      lambda: out('lambda', 4),
      lambdaTarget: out('lambdaTarget', 4),
      throttlePct: 'throttlePct' in series.channels ? out('throttlePct', 1) : null,
    },
    kept: series.kept && rounded(series.kept, 4),
    funnel: view ? view.funnel.map((line) => ({ ...line })) : null,
    delayUsed: view?.delayUsed ?? null,
    revisionId: ready.revisionId,
    rangeS: series.rangeS,
    sampleCount: series.sampleCount,
    isExact: series.isExact,
  };
}

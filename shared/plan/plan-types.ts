/**
 * The shapes of a session plan: what the planner takes (the table's axes and per-cell
 * statistics from accumulation), its options (the API's plan request plus tuning knobs), and
 * the targets it returns, shaped exactly as the API's plan targets.
 */
import { type Grid } from '../core/table';
import { type GearingSpec } from '../physics/vehicle-spec';

/** A dyno session (hold RPM, step load) or a road session (gear and speed). */
export type PlanKind = 'dyno' | 'road';

/** One target of a plan, as the API returns it (the server adds `id`). */
export interface PlanTarget {
  /** Database id, set by the server. */
  readonly id?: string;
  /** Position in the session, from 1. */
  readonly order: number;
  /** A measured hold, or light-load running to cool down. */
  readonly kind: 'hold' | 'cooldown';
  /** Engine speed, rpm (the cell's breakpoint). */
  readonly rpm: number;
  /** Manifold pressure, kPa absolute (the cell's breakpoint). */
  readonly mapKpa: number;
  /** Row of the cell (MAP index). */
  readonly row: number;
  /** Column of the cell (RPM index). */
  readonly col: number;
  /** Gear, 1-based; null on a dyno (and on an unreachable road target). */
  readonly gear: number | null;
  /** Road speed in that gear, km/h; null on a dyno (and on an unreachable road target). */
  readonly speedKph: number | null;
  /** Time to hold once settled, s. */
  readonly holdS: number;
  /** Time to let the cell settle before the hold counts, s. */
  readonly settleS: number;
  /** Whether the target can be reached in this session. */
  readonly reachable: boolean;
  /** Progress; a new plan is all pending. */
  readonly status: 'pending';
}

/** What the planner knows about the table and the data so far. */
export interface PlanInput {
  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints, kPa absolute (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
  /** Accumulated sample weight per cell; 0 where never visited. */
  readonly weight: Grid;
  /** Spread of the correction ratio per cell (standard deviation, fraction); NaN if unknown. */
  readonly spread?: Grid;
  /** Mean lambda error per cell, λ_meas/λ_cmd − 1 (positive = lean); NaN if unknown. */
  readonly lambdaError?: Grid;
  /** Locked cells (row-major, 1 = locked): never targeted. */
  readonly locked?: Uint8Array;
  /** Gearing of the vehicle; required for road plans. */
  readonly gearing?: GearingSpec;
  /** Barometric pressure, kPa; default 101.3. Cells above it are boosted. */
  readonly baroKpa?: number;
}

/** Options of a plan: the API's request fields first, then tuning knobs with defaults. */
export interface PlanOptions {
  /** Dyno or road. */
  readonly kind: PlanKind;
  /** Largest number of holds (cooldowns not counted); default 20. */
  readonly maxTargets?: number;
  /** Road: speed never to exceed, km/h; default 100. */
  readonly speedLimitKph?: number;
  /** Highest manifold pressure the session may reach, kPa absolute; default no limit. */
  readonly boostLimitKpa?: number;
  /** Weight at which a cell counts as covered; default 10 (5–20 hits is common practice). */
  readonly minWeight?: number;
  /** Spread of the correction above which a cell needs more data; default 0.03. */
  readonly spreadLimit?: number;
  /** Lambda error above which a cell needs another look; default 0.03. */
  readonly lambdaErrorLimit?: number;
  /** Rows above (and below) the visited envelope still thought reachable; default 2. */
  readonly reachRows?: number;
  /** Lowest engine speed that can be held under load, rpm; default 1000. */
  readonly minRpm?: number;
  /** Road: the speed the planner prefers when several gears fit, km/h; default 70. */
  readonly typicalSpeedKph?: number;
  /** Whether to append unreachable cells that need data, marked `reachable: false`. */
  readonly includeUnreachable?: boolean;
  /** Dyno: a cooldown after this many holds at the latest; default 8. */
  readonly cooldownEvery?: number;
  /** Dyno: length of a cooldown, s; default 45. */
  readonly cooldownS?: number;
}

/** Why a cell that needs data was left out of the plan. */
export type SkipReason =
  'above boost limit' | 'outside reach' | 'below minimum rpm' | 'over speed limit' | 'locked';

/** A plan: its targets in session order and the estimated session time. */
export interface SessionPlan {
  /** Dyno or road. */
  readonly kind: PlanKind;
  /** Targets in order. */
  readonly targets: readonly PlanTarget[];
  /** Estimated session time including moves between targets, s. */
  readonly estimateS: number;
  /** Cells that needed data but were left out, and why. */
  readonly skipped: readonly {
    readonly row: number;
    readonly col: number;
    readonly reason: SkipReason;
  }[];
}

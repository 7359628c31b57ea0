/**
 * Plans the next session: picks the cells that most need data and can be reached, and orders
 * them as dyno holds (grouped by RPM ascending, load stepped upward, cooldowns after boosted
 * holds and at regular intervals) or as road targets (a gear and a speed within the speed
 * limit for each). Settle and hold times follow common practice: settle 2–5 s, hold 2–5 s,
 * boosted holds no longer than 5–10 s in all (reference.md §9).
 */
import { validateAxis } from '../core/table';
import { cellNeed, reachableRows } from './cell-need';
import {
  type PlanInput,
  type PlanOptions,
  type PlanTarget,
  type SessionPlan,
  type SkipReason,
} from './plan-types';
import { gearForRpm } from './road-gear';

/** Cells with need at or below this are left alone. */
const MIN_NEED = 0.05;
/** Settle and hold times, s (common practice, no published source). */
const TIMES = {
  dyno: { settleS: 3, holdS: 4, boostedSettleS: 2, boostedHoldS: 3 },
  road: { settleS: 2, holdS: 3, boostedSettleS: 1, boostedHoldS: 2 },
} as const;
/** Time to move between targets, s: a load step, an RPM change on the dyno, a road target. */
const MOVE_S = { loadStep: 3, rpmChange: 8, road: 15 } as const;
/** Cooldown cell: light load near 2000 rpm. */
const COOLDOWN_RPM = 2000;
const COOLDOWN_MAP_KPA = 40;

interface Candidate {
  row: number;
  col: number;
  need: number;
  gear: number | null;
  speedKph: number | null;
}

function validatePlanInput(input: PlanInput, options: PlanOptions): void {
  validateAxis(input.rpmAxis, 'planSession: input.rpmAxis');
  validateAxis(input.mapAxisKpa, 'planSession: input.mapAxisKpa');
  const { rows, cols, data } = input.weight;
  if (
    rows !== input.mapAxisKpa.length ||
    cols !== input.rpmAxis.length ||
    data.length !== rows * cols
  ) {
    throw new Error('planSession: input.weight must be a mapAxisKpa × rpmAxis grid');
  }
  for (const [grid, name] of [
    [input.spread, 'spread'],
    [input.lambdaError, 'lambdaError'],
  ] as const) {
    if (grid && (grid.rows !== rows || grid.cols !== cols)) {
      throw new Error(`planSession: input.${name} must be the same size as input.weight`);
    }
  }
  if (input.locked && input.locked.length !== rows * cols) {
    throw new Error('planSession: input.locked must have one entry per cell');
  }
  if (options.kind !== 'dyno' && options.kind !== 'road') {
    throw new Error('planSession: options.kind must be "dyno" or "road"');
  }
  if (options.kind === 'road' && !input.gearing) {
    throw new Error('planSession: input.gearing is required for a road plan');
  }
  const max = options.maxTargets ?? 20;
  if (!Number.isInteger(max) || max < 1 || max > 500) {
    throw new Error('planSession: options.maxTargets must be an integer from 1 to 500');
  }
  if (options.speedLimitKph !== undefined && !(options.speedLimitKph > 0)) {
    throw new Error('planSession: options.speedLimitKph must be greater than 0');
  }
  if (options.boostLimitKpa !== undefined && !(options.boostLimitKpa > 0)) {
    throw new Error('planSession: options.boostLimitKpa must be greater than 0');
  }
}

/** The breakpoint index nearest `value`. */
function nearestIndex(axis: readonly number[], value: number): number {
  let best = 0;
  axis.forEach((v, i) => {
    if (Math.abs(v - value) < Math.abs((axis[best] as number) - value)) best = i;
  });
  return best;
}

/**
 * Plans a session. `options.boostLimitKpa` is a manifold pressure in kPa absolute (the axes'
 * unit): no target lies above it. Road targets whose engine speed needs more than
 * `speedLimitKph` in every gear are left out (listed in `skipped`), or with
 * `includeUnreachable` appended with `reachable: false` and no gear or speed; no target ever
 * carries a speed above the limit.
 */
export function planSession(input: PlanInput, options: PlanOptions): SessionPlan {
  validatePlanInput(input, options);
  const kind = options.kind;
  const baroKpa = input.baroKpa ?? 101.3;
  const maxTargets = options.maxTargets ?? 20;
  const speedLimitKph = options.speedLimitKph ?? 100;
  const boostLimit = options.boostLimitKpa ?? Number.POSITIVE_INFINITY;
  const minRpm = options.minRpm ?? 1000;
  const { rows, cols } = input.weight;
  const need = cellNeed(input, options);
  const reach = reachableRows(input, options.reachRows ?? 2, baroKpa);

  const chosen: Candidate[] = [];
  const unreachable: Candidate[] = [];
  const skipped: { row: number; col: number; reason: SkipReason }[] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const cellNeedValue = need.data[r * cols + c] as number;
      if (cellNeedValue <= MIN_NEED) continue;
      const mapKpa = input.mapAxisKpa[r] as number;
      const rpm = input.rpmAxis[c] as number;
      const band = reach[c] as { low: number; high: number };
      const candidate: Candidate = {
        row: r,
        col: c,
        need: cellNeedValue,
        gear: null,
        speedKph: null,
      };
      let reason: SkipReason | null = null;
      if (input.locked?.[r * cols + c]) reason = 'locked';
      else if (mapKpa > boostLimit) reason = 'above boost limit';
      else if (rpm < minRpm) reason = 'below minimum rpm';
      else if (r < band.low || r > band.high) reason = 'outside reach';
      else if (kind === 'road') {
        const choice = gearForRpm(rpm, input.gearing!, {
          speedLimitKph,
          typicalSpeedKph: options.typicalSpeedKph,
        });
        if (choice) {
          candidate.gear = choice.gear;
          candidate.speedKph = Math.round(choice.speedKph * 10) / 10;
          if (candidate.speedKph > speedLimitKph)
            candidate.speedKph = Math.floor(choice.speedKph * 10) / 10;
        } else reason = 'over speed limit';
      }
      if (reason === null) chosen.push(candidate);
      else {
        skipped.push({ row: r, col: c, reason });
        if (
          reason === 'outside reach' ||
          reason === 'over speed limit' ||
          reason === 'below minimum rpm'
        ) {
          unreachable.push(candidate);
        }
      }
    }
  }
  const byNeed = (a: Candidate, b: Candidate): number =>
    b.need - a.need || a.col - b.col || a.row - b.row;
  const picked = chosen.sort(byNeed).slice(0, maxTargets);
  const targets =
    kind === 'dyno'
      ? orderDyno(picked, input, options, baroKpa)
      : orderRoad(picked, input, baroKpa);
  if (options.includeUnreachable) {
    for (const cell of unreachable.sort(byNeed).slice(0, Math.max(0, maxTargets - picked.length))) {
      targets.push({
        ...holdOf(cell, input, kind, baroKpa),
        gear: null,
        speedKph: null,
        reachable: false,
      });
    }
  }
  const ordered = targets.map((t, i) => ({ ...t, order: i + 1 }));
  return { kind, targets: ordered, estimateS: estimateSeconds(ordered, kind), skipped };
}

function holdOf(
  cell: Candidate,
  input: PlanInput,
  kind: 'dyno' | 'road',
  baroKpa: number,
): PlanTarget {
  const mapKpa = input.mapAxisKpa[cell.row] as number;
  const times = TIMES[kind];
  const isBoosted = mapKpa > baroKpa;
  return {
    order: 0,
    kind: 'hold',
    rpm: input.rpmAxis[cell.col] as number,
    mapKpa,
    row: cell.row,
    col: cell.col,
    gear: kind === 'dyno' ? null : cell.gear,
    speedKph: kind === 'dyno' ? null : cell.speedKph,
    holdS: isBoosted ? times.boostedHoldS : times.holdS,
    settleS: isBoosted ? times.boostedSettleS : times.settleS,
    reachable: true,
    status: 'pending',
  };
}

/**
 * Dyno order: RPM ascending, load ascending within each RPM. A cooldown follows the last
 * boosted hold of each RPM, every third boosted hold in a row, and at the latest every
 * `cooldownEvery` holds.
 */
function orderDyno(
  picked: Candidate[],
  input: PlanInput,
  options: PlanOptions,
  baroKpa: number,
): PlanTarget[] {
  const every = options.cooldownEvery ?? 8;
  const cooldownS = options.cooldownS ?? 45;
  const row = nearestIndex(input.mapAxisKpa, COOLDOWN_MAP_KPA);
  const col = nearestIndex(input.rpmAxis, COOLDOWN_RPM);
  const cooldown: PlanTarget = {
    order: 0,
    kind: 'cooldown',
    rpm: input.rpmAxis[col] as number,
    mapKpa: input.mapAxisKpa[row] as number,
    row,
    col,
    gear: null,
    speedKph: null,
    holdS: cooldownS,
    settleS: 0,
    reachable: true,
    status: 'pending',
  };
  const holds = [...picked].sort((a, b) => a.col - b.col || a.row - b.row);
  const out: PlanTarget[] = [];
  let sinceCooldown = 0;
  let boostedRun = 0;
  holds.forEach((cell, i) => {
    const hold = holdOf(cell, input, 'dyno', baroKpa);
    out.push(hold);
    sinceCooldown++;
    const isBoosted = hold.mapKpa > baroKpa;
    boostedRun = isBoosted ? boostedRun + 1 : 0;
    const next = holds[i + 1];
    const boostEnds = isBoosted && (!next || next.col !== cell.col);
    const isLast = !next;
    if (boostEnds || boostedRun >= 3 || (sinceCooldown >= every && !isLast)) {
      out.push(cooldown);
      sinceCooldown = 0;
      boostedRun = 0;
    }
  });
  return out;
}

/** Road order: gear ascending, then speed (RPM) ascending, then load ascending. */
function orderRoad(picked: Candidate[], input: PlanInput, baroKpa: number): PlanTarget[] {
  return [...picked]
    .sort((a, b) => (a.gear as number) - (b.gear as number) || a.col - b.col || a.row - b.row)
    .map((cell) => holdOf(cell, input, 'road', baroKpa));
}

/** Settle and hold times plus the moves between targets. */
function estimateSeconds(targets: readonly PlanTarget[], kind: 'dyno' | 'road'): number {
  let total = 0;
  targets.forEach((t, i) => {
    total += t.settleS + t.holdS;
    const previous = targets[i - 1];
    if (!previous) return;
    if (kind === 'road') total += MOVE_S.road;
    else total += previous.rpm === t.rpm ? MOVE_S.loadStep : MOVE_S.rpmChange;
  });
  return total;
}

import { createGrid, type Grid } from '../core/table';
import { rpmAtSpeed } from '../physics/road-speed';
import { type GearingSpec } from '../physics/vehicle-spec';
import { planSession } from './plan-session';
import { type PlanInput } from './plan-types';

const rpmAxis = [800, 1500, 2000, 2500, 3000, 3500, 4000, 5000, 6000];
const mapAxisKpa = [30, 45, 60, 75, 90, 100, 120, 140, 160, 180];
const gearing: GearingSpec = {
  tireDiameterMm: 631.9,
  gearRatios: [3.42, 1.95, 1.3, 1.03, 0.84, 0.7],
  finalDrive: 4.06,
};

/** A weight grid where `visited(row, col)` cells carry `w`. */
function weights(visited: (row: number, col: number) => boolean, w = 50): Grid {
  const grid = createGrid(mapAxisKpa.length, rpmAxis.length);
  for (let r = 0; r < grid.rows; r++) {
    for (let c = 0; c < grid.cols; c++) if (visited(r, c)) grid.data[r * grid.cols + c] = w;
  }
  return grid;
}

/** Light-load data everywhere up to 75 kPa, nothing above. */
const partLoad: PlanInput = { rpmAxis, mapAxisKpa, gearing, weight: weights((r) => r <= 3) };

describe('planSession: choice of cells', () => {
  it('When every cell is covered and clean, then the plan is empty', () => {
    const plan = planSession({ ...partLoad, weight: weights(() => true) }, { kind: 'dyno' });
    expect(plan.targets).toEqual([]);
    expect(plan.estimateS).toBe(0);
  });

  it('When data stops at 75 kPa, then targets lie just above it, within two rows', () => {
    const plan = planSession(partLoad, { kind: 'dyno', maxTargets: 50 });
    const holds = plan.targets.filter((t) => t.kind === 'hold');
    expect(holds.length).toBeGreaterThan(0);
    for (const t of holds) expect(t.row === 4 || t.row === 5).toBe(true);
    expect(plan.skipped.some((s) => s.reason === 'outside reach' && s.row === 6)).toBe(true);
  });

  it('When maxTargets is 5, then at most 5 holds are planned', () => {
    const plan = planSession(partLoad, { kind: 'dyno', maxTargets: 5 });
    expect(plan.targets.filter((t) => t.kind === 'hold')).toHaveLength(5);
  });

  it('When a boost limit is set, then no target lies above it', () => {
    const all = { ...partLoad, weight: weights((r) => r <= 6) };
    const plan = planSession(all, { kind: 'dyno', maxTargets: 100, boostLimitKpa: 150 });
    expect(plan.targets.length).toBeGreaterThan(0);
    for (const t of plan.targets) expect(t.mapKpa).toBeLessThanOrEqual(150);
    expect(plan.skipped.some((s) => s.reason === 'above boost limit')).toBe(true);
  });

  it('When a cell has enough weight but a wide spread, then it is still targeted', () => {
    const spread = createGrid(mapAxisKpa.length, rpmAxis.length, 0.01);
    spread.data[2 * rpmAxis.length + 4] = 0.08;
    const all = { ...partLoad, weight: weights(() => true), spread };
    const plan = planSession(all, { kind: 'dyno' });
    expect(plan.targets.map((t) => [t.row, t.col])).toEqual([[2, 4]]);
  });

  it('When one cell runs lean and another equally rich, then the lean one ranks first', () => {
    const lambdaError = createGrid(mapAxisKpa.length, rpmAxis.length, 0);
    lambdaError.data[1 * rpmAxis.length + 3] = -0.05;
    lambdaError.data[2 * rpmAxis.length + 3] = 0.05;
    const all = { ...partLoad, weight: weights(() => true), lambdaError };
    const plan = planSession(all, { kind: 'dyno', maxTargets: 1 });
    expect(plan.targets.map((t) => t.row)).toEqual([2]);
  });

  it('When cells are locked or below the minimum rpm, then they are never targeted', () => {
    const locked = new Uint8Array(mapAxisKpa.length * rpmAxis.length);
    locked[4 * rpmAxis.length + 4] = 1;
    const plan = planSession({ ...partLoad, locked }, { kind: 'dyno', maxTargets: 100 });
    expect(plan.targets.some((t) => t.row === 4 && t.col === 4 && t.kind === 'hold')).toBe(false);
    expect(plan.targets.some((t) => t.rpm < 1000)).toBe(false);
  });
});

describe('planSession: dyno order', () => {
  const boosted = { ...partLoad, weight: weights((r) => r <= 6) };
  const plan = planSession(boosted, { kind: 'dyno', maxTargets: 40 });
  const holds = plan.targets.filter((t) => t.kind === 'hold');

  it('When ordered, then holds go by RPM ascending and load ascending within each RPM', () => {
    for (let i = 1; i < holds.length; i++) {
      const a = holds[i - 1]!;
      const b = holds[i]!;
      expect(a.rpm < b.rpm || (a.rpm === b.rpm && a.mapKpa < b.mapKpa)).toBe(true);
    }
  });

  it('When a boosted hold ends an RPM group, then a cooldown follows it', () => {
    expect(holds.some((t) => t.mapKpa > 101.3)).toBe(true);
    plan.targets.forEach((t, i) => {
      const next = plan.targets[i + 1];
      // Only within its RPM group may a boosted hold be followed by another hold.
      if (t.kind === 'hold' && t.mapKpa > 101.3 && next?.kind === 'hold') {
        expect(next.rpm).toBe(t.rpm);
      }
    });
    expect(plan.targets.at(-1)?.kind).toBe('cooldown');
  });

  it('When many light holds run in a row, then a cooldown comes at least every 8 holds', () => {
    let run = 0;
    for (const t of plan.targets) {
      run = t.kind === 'hold' ? run + 1 : 0;
      expect(run).toBeLessThanOrEqual(8);
    }
  });

  it('When on a dyno, then every target has no gear and no speed, and order counts from 1', () => {
    plan.targets.forEach((t, i) => {
      expect(t.gear).toBeNull();
      expect(t.speedKph).toBeNull();
      expect(t.order).toBe(i + 1);
      expect(t.status).toBe('pending');
    });
  });

  it('When the estimate is computed, then it covers every settle and hold', () => {
    const inHolds = plan.targets.reduce((s, t) => s + t.settleS + t.holdS, 0);
    expect(plan.estimateS).toBeGreaterThan(inHolds);
  });
});

describe('planSession: road', () => {
  it('When ordered, then targets go by gear, then RPM, then load, and stay under the limit', () => {
    const plan = planSession(partLoad, { kind: 'road', speedLimitKph: 90, maxTargets: 40 });
    expect(plan.targets.length).toBeGreaterThan(0);
    for (let i = 1; i < plan.targets.length; i++) {
      const a = plan.targets[i - 1]!;
      const b = plan.targets[i]!;
      const key = (t: typeof a) => [t.gear!, t.col, t.row];
      const [ka, kb] = [key(a), key(b)];
      const cmp = ka[0]! - kb[0]! || ka[1]! - kb[1]! || ka[2]! - kb[2]!;
      expect(cmp).toBeLessThan(0);
    }
    for (const t of plan.targets) {
      expect(t.kind).toBe('hold');
      expect(t.speedKph!).toBeLessThanOrEqual(90);
    }
  });

  it('When the speed limit is too low for an RPM in every gear, then the cell is skipped', () => {
    const plan = planSession(partLoad, { kind: 'road', speedLimitKph: 30, maxTargets: 100 });
    // computed from the formulas: first gear reaches 30 km/h at rpmAtSpeed(30, …) (reference.md §9)
    const firstGearMax = rpmAtSpeed(30, 0.6319, 3.42, 4.06);
    expect(plan.targets.length).toBeGreaterThan(0);
    expect(plan.targets.every((t) => t.rpm <= firstGearMax)).toBe(true);
    expect(plan.skipped.some((s) => s.reason === 'over speed limit')).toBe(true);
  });

  it('When unreachable cells are included, then they come last without gear or speed', () => {
    const plan = planSession(partLoad, {
      kind: 'road',
      speedLimitKph: 30,
      maxTargets: 100,
      includeUnreachable: true,
    });
    const firstUnreachable = plan.targets.findIndex((t) => !t.reachable);
    expect(firstUnreachable).toBeGreaterThan(0);
    for (const t of plan.targets.slice(firstUnreachable)) {
      expect(t.reachable).toBe(false);
      expect(t.gear).toBeNull();
      expect(t.speedKph).toBeNull();
    }
  });
});

describe('planSession: argument checks', () => {
  it.each([
    [{ kind: 'road' as const }, { ...partLoad, gearing: undefined }, 'input.gearing'],
    [{ kind: 'dyno' as const, maxTargets: 0 }, partLoad, 'maxTargets'],
    [{ kind: 'road' as const, speedLimitKph: -5 }, partLoad, 'speedLimitKph'],
    [{ kind: 'dyno' as const, boostLimitKpa: 0 }, partLoad, 'boostLimitKpa'],
    [{ kind: 'dyno' as const }, { ...partLoad, weight: createGrid(2, 2) }, 'input.weight'],
    [{ kind: 'dyno' as const }, { ...partLoad, rpmAxis: [2000, 1000] }, 'input.rpmAxis'],
  ])('When given bad input (%#), then the error names %s', (options, input, name) => {
    expect(() => planSession(input, options)).toThrow(name);
  });

  it('When planned, then the input is not changed', () => {
    const before = Array.from(partLoad.weight.data);
    planSession(partLoad, { kind: 'road' });
    expect(Array.from(partLoad.weight.data)).toEqual(before);
  });
});

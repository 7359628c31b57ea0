import type { VeTable } from '../core/table';
import { defaultLoadGuard, type LoadGuard } from '../correct';
import {
  DEMO_HATCH,
  DEMO_ROADSTER,
  DEMO_WAGON,
  ecuVeTable,
  simulateLog,
  trueVeTable,
  type SimVehicle,
} from '../sim';
import { analyseLogs } from './analyse-logs';
import { applyAnalysis, type AppliedTable } from './apply-analysis';

/**
 * The fuel-safety guard on the simulator's road logs, with engines, tables, barometers and
 * sensor ceilings varied so a rule that only fits one simulated car fails here. The truth is the
 * simulator's own VE surface, which the pipeline never sees. A VE below the truth makes the ECU
 * under-fuel: the engine runs lean there.
 */

interface Case {
  readonly name: string;
  readonly vehicle: SimVehicle;
  readonly seed: number;
  readonly baroKpa?: number;
  /** Overall offset of the ECU's table error (negative: the table is low, the engine lean). */
  readonly ecuOffset?: number;
  readonly ceiling?: number;
}

const CASES: readonly Case[] = [
  { name: 'boosted hatch', vehicle: DEMO_HATCH, seed: 31 },
  { name: 'boosted hatch, rich table', vehicle: DEMO_HATCH, seed: 32, ecuOffset: 0.04 },
  { name: 'boosted hatch at altitude', vehicle: DEMO_HATCH, seed: 33, baroKpa: 86 },
  { name: 'NA roadster', vehicle: DEMO_ROADSTER, seed: 34, ceiling: 1.36 },
  { name: 'wagon, lean table', vehicle: DEMO_WAGON, seed: 35, ecuOffset: -0.05 },
  { name: 'wagon, low sensor ceiling', vehicle: DEMO_WAGON, seed: 36, ceiling: 1.3 },
];

interface Round {
  readonly start: VeTable;
  readonly truth: VeTable;
  readonly guard: LoadGuard;
  readonly guarded: AppliedTable;
  readonly unguarded: AppliedTable;
  readonly stepOne: AppliedTable;
  /** 1 where the cell had trusted data. */
  readonly measured: Uint8Array;
  /** 1 where a cell sits under load and no log gave it trusted data. */
  readonly unreachedLoad: Uint8Array;
}

function oneRoadRound(c: Case): Round {
  const vehicle: SimVehicle =
    c.ecuOffset === undefined
      ? c.vehicle
      : { ...c.vehicle, ecuError: { ...c.vehicle.ecuError, offset: c.ecuOffset } };
  const start = ecuVeTable(vehicle);
  const truth = trueVeTable(vehicle);
  const log = simulateLog({
    vehicle,
    kind: 'road',
    seed: c.seed,
    durationS: 900,
    startEctC: 80,
    baroKpa: c.baroKpa,
    wideband: c.ceiling === undefined ? undefined : { maxLambda: c.ceiling },
  });
  const analysis = analyseLogs(start, [{ log }], { displacementL: vehicle.engine.displacementL });
  // The simulator logs no barometer; at altitude the shop sets it by the logs' engine-off MAP or
  // the vehicle setting. Here the known barometer stands in for that setting.
  const guard = defaultLoadGuard(c.baroKpa ?? analysis.baro.kpa);
  const n = analysis.proposal.status.length;
  const measured = new Uint8Array(n);
  const unreachedLoad = new Uint8Array(n);
  const cols = start.rpmAxis.length;
  analysis.proposal.status.forEach((status, k) => {
    measured[k] = status === 'trusted' ? 1 : 0;
    const mapKpa = start.mapAxisKpa[Math.floor(k / cols)] as number;
    unreachedLoad[k] = status !== 'trusted' && mapKpa >= guard.loadLineKpa ? 1 : 0;
  });
  return {
    start,
    truth,
    guard,
    guarded: applyAnalysis(start, analysis.cells, { guard }),
    unguarded: applyAnalysis(start, analysis.cells, { guard: null }),
    stepOne: applyAnalysis(start, analysis.cells, { guard, stepFraction: 1 }),
    measured,
    unreachedLoad,
  };
}

/** Value of cell k of a table. */
function at(table: VeTable, k: number): number {
  const cols = table.rpmAxis.length;
  return table.values[Math.floor(k / cols)]?.[k % cols] as number;
}

/** Cells (in `mask`) where `table` is leaner than `reference` by more than `fraction`. */
function leanerThan(table: VeTable, reference: VeTable, mask: Uint8Array, fraction: number) {
  let count = 0;
  mask.forEach((on, k) => {
    if (on && at(table, k) / at(reference, k) - 1 < -fraction - 1e-12) count++;
  });
  return count;
}

/** Mean |table/truth − 1| over the cells in `mask` (all when absent), %. */
function meanErrorPct(table: VeTable, truth: VeTable, mask?: Uint8Array): number {
  let sum = 0;
  let n = 0;
  const size = truth.rpmAxis.length * truth.mapAxisKpa.length;
  for (let k = 0; k < size; k++) {
    if (mask && !mask[k]) continue;
    sum += Math.abs(at(table, k) / at(truth, k) - 1);
    n++;
  }
  return (100 * sum) / n;
}

const rounds = new Map(CASES.map((c) => [c.name, oneRoadRound(c)]));

describe.each(CASES)('the guard after one road round: $name', (c) => {
  const round = rounds.get(c.name) as Round;

  it('When the defaults apply, then no unreached cell under load ends leaner than before beyond the allowance', () => {
    const { guarded, start, unreachedLoad, guard } = round;
    expect(unreachedLoad.some((on) => on === 1)).toBe(true);
    expect(leanerThan(guarded.table, start, unreachedLoad, guard.leanAllowance)).toBe(0);
    // Every held cell is one of them, and keeps its base value exactly.
    guarded.held.forEach((isHeld, k) => {
      if (!isHeld) return;
      expect(unreachedLoad[k]).toBe(1);
      expect(at(guarded.table, k)).toBe(at(start, k));
    });
  });

  it('When the defaults apply, then the measured cells move toward the truth and the whole table is closer', () => {
    const { guarded, stepOne, start, truth, measured } = round;
    expect(measured.reduce((n, m) => n + m, 0)).toBeGreaterThan(15);
    // Full step: measured cells end within 1 % of the truth.
    expect(meanErrorPct(stepOne.table, truth, measured)).toBeLessThan(1);
    // Default half step: their error falls by about half.
    expect(meanErrorPct(guarded.table, truth, measured)).toBeLessThan(
      0.65 * meanErrorPct(start, truth, measured),
    );
    expect(meanErrorPct(guarded.table, truth)).toBeLessThan(meanErrorPct(start, truth));
  });
});

describe('the guard across the cases', () => {
  it('When the guard is off, then guesses do lean unreached load cells: the guard is what prevents it', () => {
    let leanedWithoutGuard = 0;
    for (const round of rounds.values()) {
      leanedWithoutGuard += leanerThan(
        round.unguarded.table,
        round.start,
        round.unreachedLoad,
        round.guard.leanAllowance,
      );
      expect(round.unguarded.heldCount).toBe(0);
    }
    expect(leanedWithoutGuard).toBeGreaterThan(0);
  });

  it('prints the figures for the closing note', () => {
    const lines = [...rounds.entries()].map(([name, r]) => {
      const unreached = r.unreachedLoad.reduce((n, m) => n + m, 0);
      const leanVsTruth = (t: VeTable) => leanerThan(t, r.truth, r.unreachedLoad, 0.03);
      return [
        name.padEnd(28),
        `unreached load cells ${unreached}`,
        `>3 % lean vs truth: start ${leanVsTruth(r.start)}, unguarded ${leanVsTruth(
          r.unguarded.table,
        )}, guarded ${leanVsTruth(r.guarded.table)}`,
        `leaner than start >1 %: unguarded ${leanerThan(
          r.unguarded.table,
          r.start,
          r.unreachedLoad,
          0.01,
        )}, guarded ${leanerThan(r.guarded.table, r.start, r.unreachedLoad, 0.01)}`,
        `held ${r.guarded.heldCount}`,
        `all-cells error ${meanErrorPct(r.start, r.truth).toFixed(2)} → ${meanErrorPct(
          r.guarded.table,
          r.truth,
        ).toFixed(2)} % (unguarded ${meanErrorPct(r.unguarded.table, r.truth).toFixed(2)})`,
        `measured ${meanErrorPct(r.start, r.truth, r.measured).toFixed(2)} → ${meanErrorPct(
          r.guarded.table,
          r.truth,
          r.measured,
        ).toFixed(2)} % (step 1: ${meanErrorPct(r.stepOne.table, r.truth, r.measured).toFixed(2)})`,
      ].join(' | ');
    });
    if (process.env['CELLSMITH_PRINT_FIGURES']) process.stdout.write(`${lines.join('\n')}\n`);
    expect(lines).toHaveLength(CASES.length);
  });
});

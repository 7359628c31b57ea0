import type { VeTable } from '../core/table';
import { parseCsvText } from '../import';
import {
  csvText,
  DEMO_HATCH,
  DEMO_ROADSTER,
  ecuVeTable,
  simulateSamples,
  trueVeTable,
} from '../sim';
import type { CsvStyle } from '../sim/csv-export';
import type { SimVehicle } from '../sim/sim-vehicle';
import { analyseLogs } from './analyse-logs';
import { applyAnalysis } from './apply-analysis';

/** Mean absolute error of `table` against the truth, % of the truth, over `cells` (default all). */
function meanAbsErrorPct(
  table: VeTable,
  truth: VeTable,
  cells?: (index: number) => boolean,
): number {
  let sum = 0;
  let n = 0;
  const cols = truth.rpmAxis.length;
  table.values.forEach((row, r) =>
    row.forEach((value, c) => {
      if (cells && !cells(r * cols + c)) return;
      const expected = truth.values[r]?.[c] as number;
      sum += Math.abs(value / expected - 1);
      n++;
    }),
  );
  return (100 * sum) / n;
}

/** One simulated session written as CSV in `style` and read back through the import stage. */
function importedSession(
  vehicle: SimVehicle,
  ecuTable: VeTable,
  kind: 'road' | 'dyno',
  style: CsvStyle,
  seed: number,
) {
  const text = csvText(
    simulateSamples({
      vehicle,
      kind,
      seed,
      ecuTable,
      durationS: kind === 'road' ? 900 : undefined,
    }),
    style,
    { vehicleLabel: vehicle.label, stoichAfr: vehicle.engine.stoichAfr },
  );
  const { log, suggestion } = parseCsvText(text, undefined, {
    stoichAfr: vehicle.engine.stoichAfr,
  });
  expect(suggestion?.missing ?? []).toEqual([]);
  return { log, ecuTable };
}

/**
 * Two rounds of import → align → filter → accumulate → correct (step 1) → fill on simulated
 * sessions, each round logged on the table the previous round produced. The truth is the
 * simulator's own VE surface, which the pipeline never sees.
 */
describe.each([
  { vehicle: DEMO_HATCH, styles: ['snake', 'bracketed'] as const },
  { vehicle: DEMO_ROADSTER, styles: ['unitsrow', 'snake'] as const },
])('convergence on $vehicle.label', ({ vehicle, styles }) => {
  it('When two rounds are applied, then visited cells are within 1 % and the table is closer', () => {
    const truth = trueVeTable(vehicle);
    const start = ecuVeTable(vehicle);
    let table = start;
    let visited: (index: number) => boolean = () => false;
    for (let round = 0; round < 2; round++) {
      const logs = [
        importedSession(vehicle, table, 'road', styles[round % 2] as CsvStyle, 100 + round),
        importedSession(vehicle, table, 'dyno', styles[(round + 1) % 2] as CsvStyle, 200 + round),
      ];
      const analysis = analyseLogs(table, logs, { displacementL: vehicle.engine.displacementL });
      const status = analysis.proposal.status;
      visited = (index) => status[index] === 'trusted';
      table = applyAnalysis(table, analysis.cells, {
        stepFraction: 1,
        smooth: 0,
        fill: true,
      }).table;
    }
    const visitedCount = truth.values.flat().filter((_, index) => visited(index)).length;
    expect(visitedCount).toBeGreaterThan(40);
    const visitedAfter = meanAbsErrorPct(table, truth, visited);
    const wholeBefore = meanAbsErrorPct(start, truth);
    const wholeAfter = meanAbsErrorPct(table, truth);
    expect(visitedAfter).toBeLessThan(1);
    expect(wholeAfter).toBeLessThan(0.7 * wholeBefore);
  });
});

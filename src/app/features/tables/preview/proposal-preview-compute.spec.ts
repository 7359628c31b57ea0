import type { AnalysisSettingsBody } from '@shared/contracts/analyses';
import type { AppliedGuard } from '@shared/contracts/tables';
import { analyseLogs, applyAnalysis, type AnalysisSettings } from '@shared/pipeline';
import { DEMO_ROADSTER, ecuVeTable, simulateLog } from '@shared/sim';
// The server's own conversions: what it stores of an analysis, what it answers the client
// with, and what it reads back before it applies.
import {
  cellResults,
  storeAnalysis,
  storedEvidence,
} from '../../../../../server/services/analysis-json';
import {
  type CellRef,
  type PreviewApplyOptions,
  cellMask,
  computeProposalPreview,
  countOrigins,
  evidenceGrids,
  loadGuardOf,
  roundVe,
  summarisePreview,
} from './proposal-preview-compute';
import { applySettingsOf } from '../analysis/analysis-apply-model';

describe('cellMask', () => {
  it.each([
    [[[0, 0]], [1, 0, 0, 0, 0, 0]],
    [
      [
        [1, 2],
        [0, 1],
      ],
      [0, 1, 0, 0, 0, 1],
    ],
    [[], [0, 0, 0, 0, 0, 0]],
  ] as [CellRef[], number[]][])('When the cells are %j, then the 2×3 mask is %j', (cells, mask) => {
    expect(Array.from(cellMask(cells, 2, 3, 'onlyCells') ?? [])).toEqual(mask);
  });

  it('When there is no list, then there is no mask', () => {
    expect(cellMask(undefined, 2, 3, 'lockedCells')).toBeUndefined();
  });

  it.each([
    [[2, 0], 'lockedCells: cell [2, 0] is outside the 2×3 table'],
    [[0, 3], 'lockedCells: cell [0, 3] is outside the 2×3 table'],
    [[-1, 0], 'lockedCells: cell [-1, 0] is outside the 2×3 table'],
  ] as [CellRef, string][])('When a cell is %j, then it refuses with %j', (cell, message) => {
    expect(() => cellMask([cell], 2, 3, 'lockedCells')).toThrow(message);
  });
});

describe('roundVe', () => {
  it.each([
    [80.004, 80],
    [80.005, 80.01],
    [79.999, 80],
    [102.456, 102.46],
    [55.5, 55.5],
  ])('When a value is %d, then it is stored as %d', (value, rounded) => {
    expect(roundVe([[value]])).toEqual([[rounded]]);
  });
});

describe('evidenceGrids', () => {
  it('When a cell has no ratio or spread, then the grids hold NaN there', () => {
    const { ratio, weight, spread } = evidenceGrids([
      [
        { weight: 12, ratio: 1.05, spread: 0.02 },
        { weight: 0, ratio: null, spread: null },
      ],
    ]);
    expect(Array.from(ratio.data)).toEqual([1.05, NaN]);
    expect(Array.from(weight.data)).toEqual([12, 0]);
    expect(Array.from(spread.data)).toEqual([0.02, NaN]);
  });

  it('When a row is short, then it names the row', () => {
    const cell = { weight: 1, ratio: 1, spread: 0 };
    expect(() => evidenceGrids([[cell, cell], [cell]])).toThrow('row 1 has 1 columns, expected 2');
  });
});

describe('summarisePreview', () => {
  it.each([
    [
      'one cell goes up and one down',
      [[50, 60, 70]],
      [[55, 60, 56]],
      { changed: 2, richer: 1, leaner: 1, largestChangePct: -20, largestAt: [0, 2] },
    ],
    [
      'nothing moves',
      [[50, 60]],
      [[50, 60]],
      { changed: 0, richer: 0, leaner: 0, largestChangePct: 0, largestAt: null },
    ],
  ])('When %s, then the counts and the largest change are right', (_, base, preview, expected) => {
    expect(summarisePreview(base, preview)).toMatchObject(expected);
  });

  it('When cells change, then the mean is the mean change of the changed cells', () => {
    // +10 % and −10 % and an unchanged cell: mean 0 over the two that changed.
    expect(summarisePreview([[50, 60, 70]], [[55, 54, 70]]).meanChangePct).toBeCloseTo(0, 10);
    expect(summarisePreview([[50, 100]], [[55, 120]]).meanChangePct).toBeCloseTo(15, 10);
  });
});

/**
 * The preview must equal what the server stores. This runs a real analysis over a simulated
 * session, stores it as the server does, answers it to the client as the server does (through
 * JSON, with the guard `analysisGuard` derives from the logs' barometric pressure and the
 * vehicle's fuel-safety settings), then applies it once as `applyStoredAnalysis` does (the stored
 * evidence, the analysis's own maxStepPercent / minWeight / maxSpread, the masks, the guard or
 * null for `guard: false`, rounding to 0.01) and once through the preview. The option mapping
 * below copies `applyStoredAnalysis` and `analysisGuard`, which are not exported.
 */
describe('computeProposalPreview against the server’s apply', () => {
  const vehicle = DEMO_ROADSTER;
  const base = ecuVeTable(vehicle);
  const logs = {
    dyno: simulateLog({ vehicle, kind: 'dyno', seed: 11, ecuTable: base }),
    road: simulateLog({ vehicle, kind: 'road', seed: 5, ecuTable: base }),
  };
  const rows = base.mapAxisKpa.length;
  const cols = base.rpmAxis.length;

  /** A vehicle's fuel-safety settings, as `shared/contracts/vehicles` stores them. */
  interface FuelSafety {
    loadLinePercentOfBaro: number;
    leanAllowancePercent: number;
  }
  const DEFAULT_SAFETY: FuelSafety = { loadLinePercentOfBaro: 90, leanAllowancePercent: 1 };

  function serverMask(cells: readonly CellRef[] | undefined): Uint8Array | undefined {
    if (!cells) return undefined;
    const mask = new Uint8Array(rows * cols);
    for (const [r, c] of cells) mask[r * cols + c] = 1;
    return mask;
  }

  /** The analysis, stored and read back as the server does, with its resource's guard. */
  function storedAnalysis(
    kind: keyof typeof logs,
    settings: AnalysisSettingsBody,
    safety: FuelSafety,
  ) {
    const analysis = analyseLogs(
      base,
      [{ log: logs[kind] }],
      { displacementL: vehicle.engine.displacementL },
      settings as AnalysisSettings,
    );
    const stored = JSON.parse(JSON.stringify(storeAnalysis(analysis))) as ReturnType<
      typeof storeAnalysis
    >;
    // analysisGuard: the vehicle's line over the logs' pressure, rounded to 0.01 kPa.
    const guard: AppliedGuard = {
      loadLineKpa: Math.round(analysis.baro.kpa * safety.loadLinePercentOfBaro) / 100,
      loadLinePercentOfBaro: safety.loadLinePercentOfBaro,
      leanAllowancePercent: safety.leanAllowancePercent,
      baroKpa: analysis.baro.kpa,
      baroSource: analysis.baro.source,
    };
    return { stored, guard: JSON.parse(JSON.stringify(guard)) as AppliedGuard };
  }

  function serverApply(
    kind: keyof typeof logs,
    settings: AnalysisSettingsBody,
    safety: FuelSafety,
    body: PreviewApplyOptions,
  ) {
    const { stored, guard: analysisGuard } = storedAnalysis(kind, settings, safety);
    const guard = body.guard === false ? null : analysisGuard;
    const applied = applyAnalysis(base, storedEvidence(stored.cells), {
      stepFraction: body.stepFraction,
      smooth: body.smooth,
      fill: body.fill,
      maxReach: body.maxReach,
      locked: serverMask(body.lockedCells),
      only: serverMask(body.onlyCells),
      maxStepPercent: settings.maxStepPercent,
      minWeight: settings.minWeight,
      maxSpread: settings.maxSpread,
      guard: guard && {
        loadLineKpa: guard.loadLineKpa,
        leanAllowance: guard.leanAllowancePercent / 100,
      },
    });
    return {
      values: applied.table.values.map((row) => row.map((v) => Math.round(v * 100) / 100)),
      origin: applied.origin,
      heldCount: applied.heldCount,
    };
  }

  function clientPreview(
    kind: keyof typeof logs,
    settings: AnalysisSettingsBody,
    safety: FuelSafety,
    apply: PreviewApplyOptions,
  ) {
    const { stored, guard } = storedAnalysis(kind, settings, safety);
    // What GET /api/analyses/:id answers, as the browser parses it.
    const cells = JSON.parse(
      JSON.stringify(cellResults(stored.cells, stored.proposal)),
    ) as ReturnType<typeof cellResults>;
    return computeProposalPreview({
      rpmAxis: base.rpmAxis,
      mapAxisKpa: base.mapAxisKpa,
      baseValues: base.values,
      cells,
      settings: { ...applySettingsOf(settings), guard },
      apply,
    });
  }

  const selection: CellRef[] = [
    [4, 4],
    [4, 5],
    [5, 4],
    [5, 5],
    [6, 6],
  ];
  /** A load line low enough to reach the part-load cells a road log leaves without data. */
  const LOW_LINE: FuelSafety = { loadLinePercentOfBaro: 50, leanAllowancePercent: 0 };

  it.each<[string, keyof typeof logs, AnalysisSettingsBody, FuelSafety, PreviewApplyOptions]>([
    ['defaults', 'dyno', {}, DEFAULT_SAFETY, {}],
    ['a full step, no smoothing', 'dyno', {}, DEFAULT_SAFETY, { stepFraction: 1, smooth: 0 }],
    [
      'strict trust settings of the analysis',
      'dyno',
      { minWeight: 20, maxStepPercent: 5, maxSpread: 0.03 },
      DEFAULT_SAFETY,
      { stepFraction: 0.8, smooth: 0.6 },
    ],
    ['no fill', 'dyno', { minWeight: 8 }, DEFAULT_SAFETY, { stepFraction: 0.5, fill: false }],
    ['a fill reach of 1', 'dyno', {}, DEFAULT_SAFETY, { fill: true, maxReach: 1, smooth: 0.2 }],
    [
      'locked cells',
      'dyno',
      {},
      DEFAULT_SAFETY,
      {
        stepFraction: 0.7,
        lockedCells: [
          [3, 3],
          [3, 4],
          [0, 0],
        ],
      },
    ],
    [
      'only the selection',
      'dyno',
      {},
      DEFAULT_SAFETY,
      { stepFraction: 0.9, onlyCells: selection, lockedCells: [[4, 4]] },
    ],
    ['a road log, the guard on', 'road', {}, DEFAULT_SAFETY, { stepFraction: 1 }],
    ['a road log, the guard off', 'road', {}, DEFAULT_SAFETY, { stepFraction: 1, guard: false }],
    ['a road log, a low load line, no allowance', 'road', {}, LOW_LINE, { stepFraction: 1 }],
    [
      'a road log, a low load line, the guard turned on explicitly, locks',
      'road',
      {},
      LOW_LINE,
      { stepFraction: 1, guard: true, lockedCells: [[rows - 1, cols - 1]] },
    ],
  ])(
    'When the options are %s (%s), then every cell and its origin equal the server’s',
    (_, kind, settings, safety, apply) => {
      const expected = serverApply(kind, settings, safety, apply);
      const preview = clientPreview(kind, settings, safety, apply);
      expect(preview.values).toHaveLength(rows);
      let moved = 0;
      preview.values.forEach((row, r) =>
        row.forEach((value, c) => {
          expect({ cell: [r, c], value, origin: preview.origin[r]?.[c] }).toEqual({
            cell: [r, c],
            value: expected.values[r]?.[c],
            origin: expected.origin[r * cols + c],
          });
          if (value !== base.values[r]?.[c]) moved++;
        }),
      );
      expect(preview.heldCount).toBe(expected.heldCount);
      expect(preview.guard === null).toBe(apply.guard === false);
      // The comparison is only worth something if the analysis moved cells.
      expect(moved).toBeGreaterThan(0);
    },
  );

  it('When the load line is low and the guard on, then cells are held and keep their base value', () => {
    const preview = clientPreview('road', {}, LOW_LINE, { stepFraction: 1 });
    const unguarded = clientPreview('road', {}, LOW_LINE, { stepFraction: 1, guard: false });
    // Worth checking only if the guard had something to hold.
    expect(preview.heldCount).toBeGreaterThan(0);
    expect(countOrigins(preview.origin).held).toBe(preview.heldCount);
    expect(unguarded.heldCount).toBe(0);
    expect(countOrigins(unguarded.origin).held).toBe(0);
    preview.origin.forEach((row, r) =>
      row.forEach((origin, c) => {
        if (origin !== 'held') return;
        expect(base.mapAxisKpa[r]).toBeGreaterThanOrEqual(preview.guard?.loadLineKpa ?? Infinity);
        expect(preview.values[r]?.[c]).toBe(roundVe([[base.values[r]?.[c] ?? NaN]])[0]?.[0]);
        // Without the guard the same cell went leaner.
        expect(unguarded.values[r]?.[c]).toBeLessThan(base.values[r]?.[c] ?? -Infinity);
      }),
    );
  });
});

describe('loadGuardOf', () => {
  const guard = { loadLineKpa: 91.19, leanAllowancePercent: 1.5 };

  it.each([
    {
      when: 'on',
      given: guard,
      isOn: true,
      expected: { loadLineKpa: 91.19, leanAllowance: 0.015 },
    },
    {
      when: 'not named',
      given: guard,
      isOn: undefined,
      expected: { loadLineKpa: 91.19, leanAllowance: 0.015 },
    },
    { when: 'off', given: guard, isOn: false, expected: null },
    { when: 'on but the analysis names none', given: undefined, isOn: true, expected: undefined },
  ])('When the guard is $when, then the core gets $expected', ({ given, isOn, expected }) => {
    expect(loadGuardOf(given, isOn)).toEqual(expected);
  });
});

describe('countOrigins', () => {
  it('When origins are counted, then each kind has its number', () => {
    expect(
      countOrigins([
        ['measured', 'filled', 'filled'],
        ['held', 'locked', 'unchanged'],
      ]),
    ).toEqual({ measured: 1, filled: 2, held: 1, locked: 1, unchanged: 1 });
  });
});

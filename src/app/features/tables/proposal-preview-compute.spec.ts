import type { AnalysisSettingsBody } from '@shared/contracts/analyses';
import { analyseLogs, applyAnalysis, type AnalysisSettings } from '@shared/pipeline';
import { DEMO_ROADSTER, ecuVeTable, simulateLog } from '@shared/sim';
// The server's own conversions: what it stores of an analysis, what it answers the client
// with, and what it reads back before it applies.
import {
  cellResults,
  storeAnalysis,
  storedEvidence,
} from '../../../../server/services/analysis-json';
import {
  type CellRef,
  type PreviewApplyOptions,
  cellMask,
  computeProposalPreview,
  evidenceGrids,
  roundVe,
  summarisePreview,
} from './proposal-preview-compute';
import { applySettingsOf } from './analysis-apply-model';

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
 * dyno session, stores it as the server does, answers it to the client as the server does
 * (through JSON), then applies it once as `applyStoredAnalysis` does (the stored evidence, the
 * analysis's own maxStepPercent / minWeight / maxSpread, the masks, rounding to 0.01) and once
 * through the preview. The option mapping below copies `applyStoredAnalysis`, which is not a
 * pure function it could be imported as.
 */
describe('computeProposalPreview against the server’s apply', () => {
  const vehicle = DEMO_ROADSTER;
  const base = ecuVeTable(vehicle);
  const log = simulateLog({ vehicle, kind: 'dyno', seed: 11, ecuTable: base });
  const rows = base.mapAxisKpa.length;
  const cols = base.rpmAxis.length;

  function serverMask(cells: readonly CellRef[] | undefined): Uint8Array | undefined {
    if (!cells) return undefined;
    const mask = new Uint8Array(rows * cols);
    for (const [r, c] of cells) mask[r * cols + c] = 1;
    return mask;
  }

  function serverApply(settings: AnalysisSettingsBody, body: PreviewApplyOptions): number[][] {
    const analysis = analyseLogs(
      base,
      [{ log }],
      { displacementL: vehicle.engine.displacementL },
      settings as AnalysisSettings,
    );
    const stored = JSON.parse(JSON.stringify(storeAnalysis(analysis))) as ReturnType<
      typeof storeAnalysis
    >;
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
    });
    return applied.table.values.map((row) => row.map((v) => Math.round(v * 100) / 100));
  }

  function clientPreview(settings: AnalysisSettingsBody, apply: PreviewApplyOptions): number[][] {
    const analysis = analyseLogs(
      base,
      [{ log }],
      { displacementL: vehicle.engine.displacementL },
      settings as AnalysisSettings,
    );
    const stored = storeAnalysis(analysis);
    // What GET /api/analyses/:id answers, as the browser parses it.
    const cells = JSON.parse(
      JSON.stringify(cellResults(stored.cells, stored.proposal)),
    ) as ReturnType<typeof cellResults>;
    return computeProposalPreview({
      rpmAxis: base.rpmAxis,
      mapAxisKpa: base.mapAxisKpa,
      baseValues: base.values,
      cells,
      settings: applySettingsOf(settings),
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

  it.each<[string, AnalysisSettingsBody, PreviewApplyOptions]>([
    ['defaults', {}, {}],
    ['a full step, no smoothing', {}, { stepFraction: 1, smooth: 0 }],
    [
      'strict trust settings of the analysis',
      { minWeight: 20, maxStepPercent: 5, maxSpread: 0.03 },
      { stepFraction: 0.8, smooth: 0.6 },
    ],
    ['no fill', { minWeight: 8 }, { stepFraction: 0.5, fill: false }],
    ['a fill reach of 1', {}, { fill: true, maxReach: 1, smooth: 0.2 }],
    [
      'locked cells',
      {},
      {
        stepFraction: 0.7,
        lockedCells: [
          [3, 3],
          [3, 4],
          [0, 0],
        ],
      },
    ],
    ['only the selection', {}, { stepFraction: 0.9, onlyCells: selection, lockedCells: [[4, 4]] }],
  ])('When the options are %s, then every cell equals the server’s', (_, settings, apply) => {
    const expected = serverApply(settings, apply);
    const preview = clientPreview(settings, apply);
    expect(preview).toHaveLength(rows);
    let moved = 0;
    preview.forEach((row, r) =>
      row.forEach((value, c) => {
        expect({ cell: [r, c], value }).toEqual({ cell: [r, c], value: expected[r]?.[c] });
        if (value !== base.values[r]?.[c]) moved++;
      }),
    );
    // The comparison is only worth something if the analysis moved cells.
    expect(moved).toBeGreaterThan(0);
  });
});

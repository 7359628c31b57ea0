import { ASSUMED_GUARD } from '../../../../testing/table-fixtures';
import type { AnalysisCell, AnalysisResource } from '../../../core/api/analyses-api';
import { TEXT_ON_DARK, TEXT_ON_LIGHT } from '../../../ui/parts/colour-scale';
import { ORIGIN_MARKS, overlayView, signedFigure, type OverlayKind } from './overlays';
import type { PreviewResult } from '../preview/proposal-preview-compute';

const VALUES = [
  [50, 60],
  [70, 80],
];

function cell(partial: Partial<AnalysisCell>): AnalysisCell {
  return {
    samples: 0,
    weight: 0,
    ratio: null,
    spread: null,
    effectiveCount: 0,
    lambdaErrorPct: null,
    worstLeanPct: null,
    lambdaMeasured: null,
    lambdaCommanded: null,
    proposal: null,
    changePct: null,
    status: 'no_data',
    ...partial,
  };
}

const ANALYSIS: AnalysisResource = {
  id: 'a1',
  tableId: 't1',
  baseRevisionId: 'r1',
  logIds: ['l1'],
  settings: {},
  cells: [
    [
      cell({ weight: 12, samples: 30, spread: 0.0213, lambdaErrorPct: 4.24, changePct: 4.2 }),
      cell({}),
    ],
    [
      cell({ weight: 3, samples: 7, spread: 0.05, lambdaErrorPct: -3.06, changePct: -3.1 }),
      cell({ weight: 40, samples: 120, spread: null }),
    ],
  ],
  proposal: [
    [52.1, null],
    [67.8, 80],
  ],
  filterReport: { logs: [] },
  leanFlags: [
    {
      row: 0,
      col: 0,
      rpm: 3000,
      mapKpa: 100,
      leanPercent: 6,
      worstLeanPercent: null,
      weight: 12,
      severity: 'warn',
    },
    {
      row: 1,
      col: 0,
      rpm: 3000,
      mapKpa: 110,
      leanPercent: 5.5,
      worstLeanPercent: null,
      weight: 3,
      severity: 'watch',
    },
  ],
  guard: ASSUMED_GUARD,
  createdAt: '2026-01-01T00:00:00Z',
};

/** What the apply would write: one cell measured, one unchanged, one filled, one held. */
const PREVIEW: PreviewResult = {
  values: [
    [52.1, 60],
    [67.9, 80],
  ],
  origin: [
    ['measured', 'unchanged'],
    ['filled', 'held'],
  ],
  heldCount: 1,
  guard: { loadLineKpa: 91.19, leanAllowance: 0.01 },
};

function view(kind: OverlayKind, values = VALUES, preview: PreviewResult | null = PREVIEW) {
  return overlayView({ kind, values, baseValues: VALUES, analysis: ANALYSIS, preview });
}

describe('signedFigure', () => {
  it.each([
    [4.24, '▲ +4.2'],
    [-3.06, '▼ −3.1'],
    [0, '0.0'],
    [0.04, '0.0'],
    [-0.04, '0.0'],
    [12.96, '▲ +13.0'],
  ])('When the value is %d, then the text is %j', (value, text) => {
    expect(signedFigure(value)).toBe(text);
  });
});

describe('overlayView', () => {
  it.each([
    ['ve', ['50.0', '60.0', '70.0', '80.0']],
    ['coverage', ['12.0', '–', '3.0', '40.0']],
    ['samples', ['30', '–', '7', '120']],
    ['spread', ['2.1', '–', '5.0', '–']],
    ['lambdaError', ['▲ +4.2', '–', '▼ −3.1', '–']],
    ['proposal', ['52.1', '60.0', '67.9', '80.0']],
    // Against the analysed revision: 52.1/50 → +4.2 %, 67.9/70 → −3.0 %.
    ['change', ['▲ +4.2', '0.0', '▼ −3.0', '0.0']],
  ] as const)('When the overlay is %s, then the cells read %j', (kind, texts) => {
    expect(
      view(kind)
        .cells.flat()
        .map((c) => c.text),
    ).toEqual(texts);
  });

  it('When a cell has no number, then it has no colour', () => {
    const empty = view('lambdaError').cells[0][1];
    expect(empty).toMatchObject({ value: null, background: null, foreground: null });
  });

  it('When the VE view is coloured, then the lowest is dark with light text, the highest pale', () => {
    const cells = view('ve').cells.flat();
    expect(cells[0]).toMatchObject({ background: '#1b2f63', foreground: TEXT_ON_DARK });
    expect(cells[3]).toMatchObject({ background: '#eef6e6', foreground: TEXT_ON_LIGHT });
  });

  it('When lean and rich cells are shown, then lean is orange-side and rich blue-side', () => {
    const [lean, , rich] = view('lambdaError').cells.flat();
    const red = (hex: string | null) => parseInt((hex ?? '#000000').slice(1, 3), 16);
    const blue = (hex: string | null) => parseInt((hex ?? '#000000').slice(5, 7), 16);
    expect(red(lean.background)).toBeGreaterThan(blue(lean.background));
    expect(blue(rich.background)).toBeGreaterThan(red(rich.background));
  });

  it('When VE goes up in the change view, then it takes the rich (blue) side with ▲', () => {
    const up = view('change').cells[0][0];
    const channel = (at: number) => parseInt((up.background ?? '#000000').slice(at, at + 2), 16);
    expect(channel(5)).toBeGreaterThan(channel(1));
    expect(up.text.startsWith('▲ +')).toBe(true);
  });

  it('When the analysis flags a cell, then only that cell is marked, in every overlay', () => {
    for (const kind of ['ve', 'coverage'] as const) {
      expect(
        view(kind)
          .cells.flat()
          .map((c) => c.isLeanFlag),
      ).toEqual([true, false, false, false]);
    }
  });

  it('When a flag rests on too little data, then it is a quiet watch mark, not a lean flag', () => {
    const watched = view('ve').cells[1][0];
    expect(watched).toMatchObject({ isLeanFlag: false, isLeanWatch: true });
    expect(watched.title).toContain(
      'Looks lean under load (watch): too little data to act on: log this cell again.',
    );
    expect(view('ve').cells[0][0].title).toBe(
      'Lean under load (warning): richen this cell before the next full-load run.',
    );
  });

  it('When a value differs from the loaded revision, then the cell is marked edited', () => {
    const edited = view('ve', [
      [50, 61],
      [70, 80],
    ]);
    expect(edited.cells.flat().map((c) => c.isEdited)).toEqual([false, true, false, false]);
  });

  it.each([
    ['ve', '50.0 VE %', '80.0 VE %'],
    ['proposal', '50.0 VE %', '80.0 VE %'],
    ['coverage', '0 weight', '40 weight'],
    ['samples', '0 samples', '120 samples'],
    ['spread', '0.0 % spread', '5.0 % spread'],
    ['lambdaError', '▼ −10 % richer', '▲ +10 % leaner'],
  ] as const)('When the overlay is %s, then the legend runs from %j to %j', (kind, low, high) => {
    expect(view(kind).legend).toMatchObject({ low, high });
  });

  it('When a preview is given, then proposal and change show it, not the analysis’s proposal', () => {
    const preview = {
      ...PREVIEW,
      values: [
        [55, 60],
        [63, 80.8],
      ],
    };
    expect(
      view('proposal', VALUES, preview)
        .cells.flat()
        .map((c) => c.text),
    ).toEqual(['55.0', '60.0', '63.0', '80.8']);
    // Against the loaded revision: 55/50 → +10 %, 60/60 → 0, 63/70 → −10 %, 80.8/80 → +1 %.
    expect(
      view('change', VALUES, preview)
        .cells.flat()
        .map((c) => c.text),
    ).toEqual(['▲ +10.0', '0.0', '▼ −10.0', '▲ +1.0']);
  });

  it('When the preview has not arrived, then proposal and change show no figure and say why', () => {
    for (const kind of ['proposal', 'change'] as const) {
      const shown = view(kind, VALUES, null);
      // Not the analysis's own proposal (52.1, 67.8) or its changePct (+4.2, −3.1).
      expect(shown.cells.flat().map((c) => c.text)).toEqual(['–', '–', '–', '–']);
      expect(shown.legend.note).toContain('The figures appear once the preview is computed.');
      expect(shown.legend.marks).toBeUndefined();
    }
  });

  it('When the change view is shown, then each cell tells how the apply sets it', () => {
    const cells = view('change').cells.flat();
    expect(cells.map((c) => c.origin)).toEqual(['measured', 'unchanged', 'filled', 'held']);
    expect(cells.map((c) => c.isHeld)).toEqual([false, false, false, true]);
    expect(cells[2].title).toBe(
      'Filled: a guess from the neighbours’ correction (no trusted data here).\n' +
        'Looks lean under load (watch): too little data to act on: log this cell again.',
    );
    expect(cells[3].title).toMatch(/^Held under load, needs data: a guess would have made/);
    expect(view('change').legend.marks).toBe(ORIGIN_MARKS);
  });

  it('When another overlay is shown, then only the held mark of the preview shows', () => {
    for (const kind of ['ve', 'coverage', 'lambdaError'] as const) {
      const cells = view(kind).cells.flat();
      expect(cells.map((c) => c.origin)).toEqual([null, null, null, null]);
      expect(cells.map((c) => c.isHeld)).toEqual([false, false, false, true]);
      expect(cells[3].title).toMatch(/^Held under load, needs data/);
      expect(cells[1].title).toBeNull();
      expect(view(kind).legend.marks).toBeUndefined();
    }
  });

  it('When there is no analysis, then a leftover preview marks nothing', () => {
    const shown = overlayView({
      kind: 'change',
      values: VALUES,
      baseValues: VALUES,
      analysis: null,
      preview: PREVIEW,
    });
    expect(shown.cells.flat().map((c) => [c.text, c.isHeld, c.origin])).toEqual([
      ['–', false, null],
      ['–', false, null],
      ['–', false, null],
      ['–', false, null],
    ]);
  });
});

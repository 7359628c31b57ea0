import type { AnalysisCell, AnalysisResource } from '../../../core/api/analyses-api';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import { type CellDetailInput, cellDetail, physicsAt } from './cell-detail-text';

const ENGINE = {
  displacementL: 2,
  cylinders: 4,
  fuel: 'gasoline' as const,
  stoichAfr: 14.7,
  injectorCcMin: 550,
};

const TRUSTED: AnalysisCell = {
  samples: 1234,
  weight: 56.25,
  ratio: 1.02,
  spread: 0.018,
  effectiveCount: 40.12,
  lambdaErrorPct: 1.333,
  worstLeanPct: 6,
  lambdaMeasured: 1.0133,
  lambdaCommanded: 1,
  proposal: 85.86,
  changePct: 1,
  status: 'trusted',
};

const ANALYSIS = {
  id: 'a1',
  cells: [
    [null, null],
    [{ ...TRUSTED, status: 'too_little_data', lambdaCommanded: null }, TRUSTED],
  ],
  proposal: [
    [null, null],
    [70, 85.86],
  ],
  leanFlags: [
    {
      row: 1,
      col: 1,
      rpm: 3000,
      mapKpa: 100,
      leanPercent: 6.44,
      worstLeanPercent: 11.2,
      weight: 56.25,
      severity: 'abort',
    },
  ],
} as unknown as AnalysisResource;

/**
 * What the apply would write: the trusted cell measured (+1 %), its neighbour below the line
 * filled, and the two cells of the first row: one held, one unchanged.
 */
const PREVIEW: PreviewResult = {
  values: [
    [40, 50],
    [70.7, 85.86],
  ],
  origin: [
    ['held', 'unchanged'],
    ['filled', 'measured'],
  ],
  heldCount: 1,
  guard: { loadLineKpa: 91.1925, leanAllowance: 0.01 },
};

/** 2.0 L four-cylinder, VE 85 % at 3000 rpm and 100 kPa: the worked example's operating point. */
const INPUT: CellDetailInput = {
  rpmAxis: [1000, 3000],
  mapAxisKpa: [40, 100],
  values: [
    [40, 50],
    [70, 85],
  ],
  baseValues: [
    [40, 50],
    [70, 85],
  ],
  analysis: ANALYSIS,
  preview: PREVIEW,
  vehicle: { engine: ENGINE },
  cell: { row: 1, col: 1 },
};

/** |actual/expected − 1|; the reference rounds to five figures, so compare at 1e-4. */
function relativeError(actual: number | undefined, expected: number): number {
  return Math.abs((actual ?? NaN) / expected - 1);
}

describe('cell detail text', () => {
  it('When the cell is the worked example with λ 1 commanded, then airflow and duty match it', () => {
    const physics = physicsAt(INPUT);
    // reference.md §1, worked example [C] (no textbook example with numbers was found): 2.0 L,
    // four cylinders, 3000 rpm, MAP 100 kPa, 25 °C, VE 0.85 → ρ 1.16844 kg/m³, 49.659 g/s,
    // 496.59 mg of air per intake event; with R = 287.053 J/(kg·K) from the USSA-1976 constants.
    expect(relativeError(physics?.airflowGps, 49.659)).toBeLessThan(1e-4);
    // [C] by hand from the same example: fuel at λ 1, AFR 14.7 = 496.58 / 14.7 = 33.781 mg per
    // event; 550 cc/min × 0.745 g/cc (gasoline density, common practice, no published source)
    // = 6.8292 mg/ms → 4.9466 ms open per 40 ms cycle (two revolutions at 3000 rpm) = 12.366 %.
    expect(physics?.dutyPct).toBeCloseTo(12.3665, 3);
    expect(physics).toMatchObject({ lambda: 1, lambdaSource: 'logged', level: 'ok' });
  });

  it('When no lambda was logged at the cell, then the assumed power-enrichment λ 0.80 is used', () => {
    const physics = physicsAt({ ...INPUT, analysis: null });
    // [C] 33.781 mg × 1/0.8 = 42.227 mg per event → 15.458 % duty; airflow does not change.
    expect(physics?.dutyPct).toBeCloseTo(15.4581, 3);
    expect(relativeError(physics?.airflowGps, 49.659)).toBeLessThan(1e-4);
    expect(physics).toMatchObject({ lambda: 0.8, lambdaSource: 'assumed' });
  });

  it('When there is no vehicle, then there are no physics lines and the reason is given', () => {
    const detail = cellDetail({ ...INPUT, vehicle: null });
    expect(detail.physics).toBeNull();
    expect(detail.lines.map((l) => l.label)).not.toContain('Airflow');
    expect(detail.assumptions).toMatch(/once the vehicle’s engine is known/);
  });

  it('When a trusted, lean-flagged cell is shown, then every line reads as expected', () => {
    const detail = cellDetail(INPUT);
    expect(detail.title).toBe('3,000 rpm · 100 kPa');
    expect(detail.subtitle).toBe('Row 2 (MAP), column 2 (RPM)');
    expect(detail.lines.map((l) => [l.label, l.value, l.tone])).toEqual([
      ['VE now', '85.0 %', null],
      ['Apply writes', '85.9 %', null],
      // 85.86 / 85 − 1 = +1.0 %
      ['Change', '+1.0 %', null],
      ['How', 'Measured by the logs', null],
      ['Samples', '1,234', null],
      ['Weight', '56.3', null],
      ['Effective count', '40.1', null],
      ['Spread', '1.8 %', null],
      ['Lambda', '1.013 measured vs 1.000 commanded (▲ +1.3 % lean)', null],
      ['Status', 'Trusted: enough data for a proposal', null],
      [
        'Lean under load (stop)',
        '+6.4 % leaner than commanded, worst +11.2 % — stop loading the engine in this cell until it is richer',
        'lean',
      ],
      ['Airflow', '49.7 g/s', null],
      ['Injector duty', '12.4 %', null],
    ]);
    expect(detail.assumptions).toBe(
      'Speed density with VE now, intake air 25 °C, λ 1.000 as commanded in the logs at this ' +
        'cell; 2 L, 4 cylinders, gasoline (stoichiometric AFR 14.7), 550 cc/min injectors at ' +
        'rated pressure, no dead time: the duty is a lower bound.',
    );
  });

  it.each<[string, Partial<CellDetailInput>, [string, string][]]>([
    [
      'an edited cell without analysis',
      {
        analysis: null,
        values: [
          [40, 50],
          [70, 88],
        ],
      },
      [
        ['VE now', '88.0 % (analysed revision 85.0 %)'],
        ['Airflow', '51.4 g/s'],
        ['Injector duty', '16.0 %'],
      ],
    ],
    [
      'a cell the analysis never reached',
      { cell: { row: 0, col: 1 }, vehicle: null },
      [
        ['VE now', '50.0 %'],
        ['Apply writes', '50.0 %'],
        ['Change', '0.0 %'],
        ['How', 'Unchanged by the apply'],
        ['Samples', '–'],
        ['Weight', '–'],
        ['Effective count', '–'],
        ['Spread', '–'],
        ['Lambda', '–'],
        ['Status', 'No data'],
      ],
    ],
  ])('When the cell is %s, then the lines read as expected', (_, change, lines) => {
    const detail = cellDetail({ ...INPUT, ...change });
    expect(detail.lines.map((l) => [l.label, l.value])).toEqual(lines);
  });

  it('When a cell is held under load, then a line says it needs data and why', () => {
    const detail = cellDetail({ ...INPUT, cell: { row: 0, col: 0 }, vehicle: null });
    expect(detail.lines.slice(0, 5).map((l) => [l.label, l.value, l.tone])).toEqual([
      ['VE now', '40.0 %', null],
      ['Apply writes', '40.0 %', null],
      ['Change', '0.0 %', null],
      ['How', 'Held under load: needs data (keeps its value)', null],
      [
        'Held under load',
        'Needs data: at or above the load line (91.2 kPa), a guess from the neighbours would ' +
          'have made this cell more than 1 % leaner, so the apply keeps its value. Log this ' +
          'cell to correct it.',
        'held',
      ],
    ]);
  });

  it('When the preview has not arrived, then the apply’s lines wait for it', () => {
    const lines = cellDetail({ ...INPUT, preview: null }).lines.slice(1, 4);
    // Not the analysis's own proposal (85.86) or its changePct.
    expect(lines.map((l) => [l.label, l.value])).toEqual([
      ['Apply writes', '–'],
      ['Change', '–'],
      ['How', '–'],
    ]);
  });

  it.each([
    [
      'warn',
      'Lean under load (warning)',
      '— richen this cell before the next full-load run',
      'lean',
    ],
    [
      'watch',
      'Looks lean under load (watch)',
      '— too little data to act on: log this cell again',
      'watch',
    ],
  ] as const)('When the flag is a %s, then its line reads %j', (severity, label, action, tone) => {
    const analysis = {
      ...ANALYSIS,
      leanFlags: [{ ...ANALYSIS.leanFlags[0], severity, worstLeanPercent: null }],
    } as AnalysisResource;
    const flag = cellDetail({ ...INPUT, analysis }).lines.find((l) => l.label === label);
    expect(flag).toEqual({
      label,
      value: `+6.4 % leaner than commanded ${action}`,
      tone,
    });
  });

  it('When the user reads AFR, then lambda is shown times the fuel’s stoichiometric AFR', () => {
    const line = cellDetail({ ...INPUT, mixture: 'afr' }).lines.find((l) => l.label === 'AFR');
    // AFR = λ·AFR_st (the project's reference.md §3, practice [P]; the definition of lambda):
    // 1.000 × 14.7 = 14.70 commanded. The error percentage is the same in either display.
    expect(line?.value).toMatch(/^14\.\d\d measured vs 14\.70 commanded \(▲ \+1\.3 % lean\)$/);
    const lambda = cellDetail({ ...INPUT, vehicle: null, mixture: 'afr' }).lines;
    expect(lambda.some((l) => l.label === 'Lambda')).toBe(true);
  });

  it('When the injectors are small, then the duty line warns', () => {
    const small = { engine: { ...ENGINE, injectorCcMin: 80 } };
    const duty = cellDetail({ ...INPUT, vehicle: small }).lines.at(-1);
    // [C] 12.3665 % × 550 / 80 = 85.02 %: just past the 85 % warning (common practice).
    expect(duty).toEqual({
      label: 'Injector duty',
      value: '85.0 % — near the injector’s limit',
      tone: 'warn',
    });
  });
});

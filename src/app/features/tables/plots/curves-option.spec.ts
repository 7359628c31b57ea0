import { SEQUENTIAL_STOPS, colourAt } from '../../../ui/parts/colour-scale';
import { FALLBACK_CHART_THEMES } from './chart-theme';
import { type CurvesInput, curvesOption, rowColour } from './curves-option';

const INPUT: CurvesInput = {
  rpmAxis: [1000, 2000, 3000],
  mapAxisKpa: [40, 70, 100],
  values: [
    [40, 45, 50],
    [55, 62, 70],
    [70, 80, 88],
  ],
  proposal: null,
  selectedCell: null,
  theme: FALLBACK_CHART_THEMES.light,
};

interface Series {
  type: string;
  name: string;
  data: unknown[];
  color?: string;
  lineStyle?: { width?: number; type?: string };
}

function series(input: CurvesInput): Series[] {
  return (curvesOption(input) as { series: Series[] }).series;
}

describe('curves option', () => {
  it('When nothing is picked, then there is one line of VE against RPM per MAP breakpoint', () => {
    const lines = series(INPUT);
    expect(lines.map((s) => s.name)).toEqual(['40 kPa', '70 kPa', '100 kPa']);
    expect(lines[1].data).toEqual([
      [1000, 55],
      [2000, 62],
      [3000, 70],
    ]);
    expect(lines.every((s) => s.type === 'line' && s.lineStyle?.width === 1.5)).toBe(true);
  });

  it('When the user prefers imperial units, then each line is named in psi(a)', () => {
    const proposal = INPUT.values.map((row) => [...row]);
    const lines = series({
      ...INPUT,
      proposal,
      selectedCell: { row: 1, col: 0 },
      units: 'imperial',
    });
    // 40, 70, 100 kPa = 5.80, 10.15, 14.50 psi (1 psi = 6.894757 kPa, NIST SP 811, 2008
    // edition, Appendix B.8) [S]
    expect(lines.map((s) => s.name)).toEqual([
      '5.8 psi(a)',
      '10.15 psi(a)',
      '14.5 psi(a)',
      '10.15 psi(a) proposal',
      'Picked cell',
    ]);
  });

  it('When a cell is picked with a preview, then its row is bold and what applies dashed', () => {
    const proposal = [
      [41, 46, 51],
      [56, 63, 72],
      [71, 81, 89],
    ];
    const lines = series({ ...INPUT, proposal, selectedCell: { row: 1, col: 2 } });
    expect(lines.map((s) => s.name)).toEqual([
      '40 kPa',
      '70 kPa',
      '100 kPa',
      '70 kPa proposal',
      'Picked cell',
    ]);
    expect(lines[1].lineStyle?.width).toBe(3.5);
    expect(lines[3]).toMatchObject({
      lineStyle: { type: 'dashed' },
      color: lines[1].color,
      data: [
        [1000, 56],
        [2000, 63],
        [3000, 72],
      ],
    });
    expect(lines[4].data).toEqual([[3000, 70]]);
  });

  it('When a cell is picked without a preview, then no proposal line is drawn', () => {
    const names = series({ ...INPUT, selectedCell: { row: 0, col: 0 } }).map((s) => s.name);
    expect(names).toEqual(['40 kPa', '70 kPa', '100 kPa', 'Picked cell']);
  });

  it.each([
    [0, 3, false, 0],
    [2, 3, false, 0.75],
    [0, 3, true, 0.25],
    [2, 3, true, 1],
    [0, 1, false, 0.375],
  ])(
    'When row %p of %p is coloured (dark %p), then it sits at %p of the scale',
    (row, rows, dark, t) => {
      expect(rowColour(row, rows, dark)).toBe(colourAt(SEQUENTIAL_STOPS, t));
    },
  );
});

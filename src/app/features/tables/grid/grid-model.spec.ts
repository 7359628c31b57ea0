import {
  breakpointLabel,
  cellClasses,
  cellColours,
  cellName,
  gridColumns,
  gridRows,
} from './grid-model';
import type { CellView } from './overlays';

const VIEW: CellView = {
  value: 80,
  text: '80.0',
  background: '#eef6e6',
  foreground: '#000000',
  isLeanFlag: false,
  isLeanWatch: false,
  isEdited: false,
  origin: null,
  isHeld: false,
  title: null,
};

describe('grid model', () => {
  it('When rows are built, then each has a stable id, its MAP breakpoint and its cells', () => {
    const rows = gridRows([30, 100], [[VIEW], [VIEW]]);
    expect(rows.map((r) => [r.id, r.row, r.mapKpa, r.cells.length])).toEqual([
      ['r0', 0, 30, 1],
      ['r1', 1, 100, 1],
    ]);
  });

  it.each([
    [{}, []],
    [{ isLeanFlag: true }, ['cs-lean-flag']],
    [{ isEdited: true }, ['cs-edited']],
    [{ isLeanFlag: true, isEdited: true }, ['cs-lean-flag', 'cs-edited']],
    [{ isLeanWatch: true }, ['cs-lean-watch']],
    [{ isHeld: true }, ['cs-held']],
    // The held mark shows on every overlay; under proposal and change it comes with its origin.
    [{ isHeld: true, origin: 'held' }, ['cs-held']],
    [{ origin: 'filled' }, ['cs-filled']],
    [{ origin: 'measured' }, ['cs-measured']],
    [{ origin: 'unchanged' }, []],
    [
      { isLeanWatch: true, isHeld: true, isEdited: true },
      ['cs-lean-watch', 'cs-edited', 'cs-held'],
    ],
  ] as [Partial<CellView>, string[]][])(
    'When the cell is %j, then its classes are %j',
    (flags, classes) => {
      expect(cellClasses({ ...VIEW, ...flags })).toEqual(classes);
    },
  );

  it.each([
    [0, 0, ['cs-selected', 'cs-sel-top', 'cs-sel-left']],
    [1, 2, ['cs-selected', 'cs-sel-bottom', 'cs-sel-right']],
    [0, 1, ['cs-selected', 'cs-sel-top']],
    [2, 0, []],
  ])(
    'When cell [%d, %d] is judged against a 2 × 3 selection, then its classes are %j',
    (row, col, classes) => {
      const selection = { r0: 0, r1: 1, c0: 0, c1: 2 };
      expect(cellClasses(VIEW, row, col, { selection, isLocked: false })).toEqual(classes);
    },
  );

  it('When a cell is locked, then it carries the lock class beside its other marks', () => {
    expect(
      cellClasses({ ...VIEW, isEdited: true }, 0, 0, { selection: null, isLocked: true }),
    ).toEqual(['cs-edited', 'cs-locked']);
  });

  it('When columns are built, then the MAP column is pinned and each RPM column names its breakpoint', () => {
    const columns = gridColumns([1000, 2500.5], {
      isEditable: () => true,
      decor: () => ({ selection: null, isLocked: false }),
      edit: () => undefined,
    });
    expect(columns.map((c) => [c.colId, c.headerName, c.pinned ?? null])).toEqual([
      ['map', 'kPa \\ rpm', 'left'],
      ['c0', '1000', null],
      ['c1', '2500.5', null],
    ]);
  });

  it('When the MAP axis is shown in psi(a), then the corner names the unit and rows their psi', () => {
    const [map] = gridColumns([1000], {
      mapAxis: { unit: 'psi(a)', label: (kpa) => (kpa / 6.894757).toFixed(2) },
      isEditable: () => true,
      decor: () => ({ selection: null, isLocked: false }),
      edit: () => undefined,
    });
    expect(map?.headerName).toBe('psi(a) \\ rpm');
    const format = map?.valueFormatter as (p: { value: unknown }) => string;
    // 1 psi = 6.894757 kPa (NIST SP 811, 2008 edition, Appendix B.8).
    expect(format({ value: 101.325 })).toBe('14.70');
  });

  it('When a cell has a title, then the column gives it as the cell’s tooltip', () => {
    const [, column] = gridColumns([1000], {
      isEditable: () => true,
      decor: () => ({ selection: null, isLocked: false }),
      edit: () => undefined,
    });
    const tooltip = column?.tooltipValueGetter as (p: { data?: unknown }) => string | null;
    const row = gridRows([100], [[{ ...VIEW, title: 'Held under load, needs data' }]])[0];
    expect(tooltip({ data: row })).toBe('Held under load, needs data');
    expect(tooltip({ data: gridRows([100], [[VIEW]])[0] })).toBeNull();
  });

  it('When a cell is named for a message, then its breakpoints say which', () => {
    expect(cellName([1000, 2000], [30, 101.3], 1, 0)).toBe('cell at 1000 rpm, 101.3 kPa');
  });

  it.each([
    [VIEW, { backgroundColor: '#eef6e6', color: '#000000' }],
    [{ ...VIEW, background: null, foreground: null }, {}],
    [undefined, {}],
  ])('When the cell is %j, then its colours are %j', (view, colours) => {
    expect(cellColours(view)).toEqual(colours);
  });

  it.each([
    [800, '800'],
    [101.3, '101.3'],
    [62.25, '62.3'],
  ])('When the breakpoint is %d, then the header reads %j', (value, label) => {
    expect(breakpointLabel(value)).toBe(label);
  });
});

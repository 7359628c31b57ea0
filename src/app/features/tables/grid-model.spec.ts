import { breakpointLabel, cellClasses, cellColours, gridRows } from './grid-model';
import type { CellView } from './overlays';

const VIEW: CellView = {
  value: 80,
  text: '80.0',
  background: '#eef6e6',
  foreground: '#000000',
  isLeanFlag: false,
  isEdited: false,
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
  ])('When the cell is %j, then its classes are %j', (flags, classes) => {
    expect(cellClasses({ ...VIEW, ...flags })).toEqual(classes);
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

import {
  arrowStep,
  boundsCells,
  boundsGrid,
  cellKey,
  cellSetList,
  clampSelection,
  collapseTo,
  extendTo,
  gridTarget,
  parseCellSet,
  pressSelection,
  selectAll,
  selectionBounds,
  selectionEdges,
  selectionLabel,
  stepCell,
  withBounds,
} from './cell-range';

const at = (row: number, col: number) => ({ row, col });

describe('cell range', () => {
  it.each([
    [at(1, 1), at(2, 3), { r0: 1, r1: 2, c0: 1, c1: 3 }],
    [at(2, 3), at(1, 1), { r0: 1, r1: 2, c0: 1, c1: 3 }],
    [at(3, 0), at(0, 2), { r0: 0, r1: 3, c0: 0, c1: 2 }],
    [at(4, 4), at(4, 4), { r0: 4, r1: 4, c0: 4, c1: 4 }],
  ])('When anchor %j and focus %j, then the bounds are %j', (anchor, focus, bounds) => {
    expect(selectionBounds({ anchor, focus })).toEqual(bounds);
  });

  it('When a selection is extended, then its anchor stays and its focus moves', () => {
    const extended = extendTo(collapseTo(at(2, 2)), at(0, 4));
    expect(extended).toEqual({ anchor: at(2, 2), focus: at(0, 4) });
    expect(selectionLabel(selectionBounds(extended))).toBe('3 × 3 cells selected');
  });

  it.each([
    [{ r0: 0, r1: 0, c0: 0, c1: 0 }, '1 cell selected'],
    [{ r0: 0, r1: 2, c0: 1, c1: 4 }, '3 × 4 cells selected'],
  ])('When the bounds are %j, then the label reads %j', (bounds, label) => {
    expect(selectionLabel(bounds)).toBe(label);
  });

  it('When every cell is selected, then the selection runs from the top-left to the last cell', () => {
    expect(selectionBounds(selectAll(4, 5))).toEqual({ r0: 0, r1: 3, c0: 0, c1: 4 });
  });

  it('When cells are listed, then they come row by row', () => {
    expect(boundsCells({ r0: 1, r1: 2, c0: 0, c1: 1 })).toEqual([
      [1, 0],
      [1, 1],
      [2, 0],
      [2, 1],
    ]);
    expect(boundsGrid({ r0: 1, r1: 2, c0: 0, c1: 1 }, (r, c) => r * 10 + c)).toEqual([
      [10, 11],
      [20, 21],
    ]);
  });

  it.each([
    [0, 1, { top: true, bottom: false, left: false, right: false }],
    [1, 1, { top: false, bottom: true, left: false, right: false }],
    [0, 0, { top: true, bottom: false, left: true, right: false }],
    [1, 2, { top: false, bottom: true, left: false, right: true }],
    [3, 3, { top: false, bottom: false, left: false, right: false }],
  ])('When the cell is [%d, %d], then its selection edges are %j', (row, col, edges) => {
    expect(selectionEdges({ r0: 0, r1: 1, c0: 0, c1: 2 }, row, col)).toEqual(edges);
  });

  it.each([
    ['ArrowUp', at(-1, 0)],
    ['ArrowDown', at(1, 0)],
    ['ArrowLeft', at(0, -1)],
    ['ArrowRight', at(0, 1)],
    ['Enter', null],
  ])('When the key is %s, then the step is %j', (key, step) => {
    expect(arrowStep(key)).toEqual(step);
  });

  it('When a step would leave the table, then the cell stays at its edge', () => {
    expect(stepCell(at(0, 4), at(-1, 1), 4, 5)).toEqual(at(0, 4));
    expect(stepCell(at(2, 2), at(1, -1), 4, 5)).toEqual(at(3, 1));
  });

  it('When the table shrinks, then the selection is pulled inside it', () => {
    expect(clampSelection({ anchor: at(1, 1), focus: at(9, 9) }, 4, 5)).toEqual({
      anchor: at(1, 1),
      focus: at(3, 4),
    });
    expect(clampSelection(collapseTo(at(0, 0)), 0, 5)).toBeNull();
  });

  it.each([
    [2, 'c3', { row: 2, col: 3 }],
    [2, 'map', { row: 2, col: null }],
    [-1, 'c0', null],
    [null, 'c0', null],
    [0, 'other', null],
  ])('When the grid position is row %j, column %j, then the target is %j', (row, colId, target) => {
    expect(gridTarget(row, colId)).toEqual(target);
  });

  it('When pressing, then a plain press takes one cell, shift extends, the MAP column a row', () => {
    const current = collapseTo(at(1, 1));
    expect(pressSelection(current, { row: 3, col: 2 }, false, 5)).toEqual(collapseTo(at(3, 2)));
    expect(pressSelection(current, { row: 3, col: 2 }, true, 5)).toEqual({
      anchor: at(1, 1),
      focus: at(3, 2),
    });
    expect(pressSelection(current, { row: 2, col: null }, false, 5)).toEqual({
      anchor: at(2, 0),
      focus: at(2, 4),
    });
    expect(pressSelection(null, { row: 3, col: 2 }, true, 5)).toEqual(collapseTo(at(3, 2)));
  });

  it('When cells are locked and unlocked by range, then the set follows without mutation', () => {
    const empty = new Set<string>();
    const locked = withBounds(empty, { r0: 0, r1: 1, c0: 1, c1: 1 }, true);
    expect(cellSetList(locked)).toEqual([
      [0, 1],
      [1, 1],
    ]);
    expect(empty.size).toBe(0);
    expect(cellSetList(withBounds(locked, { r0: 1, r1: 1, c0: 1, c1: 1 }, false))).toEqual([
      [0, 1],
    ]);
  });

  it.each([
    [
      '[[0,1],[2,3]]',
      [
        [0, 1],
        [2, 3],
      ],
    ],
    ['[[0,1],[9,9],[1.5,0],["a",1],[1]]', [[0, 1]]],
    ['not json', []],
    ['{"a":1}', []],
    [null, []],
  ])('When the stored locks are %j, then the cells read back are %j', (json, cells) => {
    expect(cellSetList(parseCellSet(json, 4, 5))).toEqual(cells);
  });

  it('When a cell key is made, then it reads row:col', () => {
    expect(cellKey(3, 12)).toBe('3:12');
  });
});

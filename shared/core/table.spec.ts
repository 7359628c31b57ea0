import {
  createGrid,
  gridToJsonRows,
  jsonRowsToGrid,
  tableToGrid,
  validateTable,
  withValues,
} from './table';

describe('grids and tables', () => {
  const table = {
    rpmAxis: [1000, 2000],
    mapAxisKpa: [30, 60, 90],
    values: [
      [1, 2],
      [3, 4],
      [5, 6],
    ],
  };

  it('round-trips a table through a grid', () => {
    const grid = tableToGrid(table);
    expect(grid.rows).toBe(3);
    expect(grid.cols).toBe(2);
    expect(grid.data[1 * 2 + 0]).toBe(3);
    expect(withValues(table, grid)).toEqual(table);
  });

  it('writes NaN as null for JSON and reads it back', () => {
    const grid = createGrid(2, 2, 1);
    grid.data[3] = NaN;
    expect(gridToJsonRows(grid)).toEqual([
      [1, 1],
      [1, null],
    ]);
    expect(Number.isNaN(jsonRowsToGrid(gridToJsonRows(grid)).data[3])).toBe(true);
    expect(() => jsonRowsToGrid([[1, 2], [3]], 'cells')).toThrow(/cells\[1\] has 1 columns/);
  });

  it.each([
    [{ ...table, rpmAxis: [2000, 1000] }, /strictly ascending/],
    [{ ...table, mapAxisKpa: [30] }, /at least 2/],
    [
      {
        ...table,
        values: [
          [1, 2],
          [3, 4],
        ],
      },
      /2 rows/,
    ],
    [{ ...table, values: [[1, 2], [3], [5, 6]] }, /values\[1\] has 1 columns/],
    [
      {
        ...table,
        values: [
          [1, 2],
          [3, NaN],
          [5, 6],
        ],
      },
      /values\[1\]\[1\]/,
    ],
  ])('refuses a malformed table (%#)', (bad, message) => {
    expect(() => validateTable(bad)).toThrow(message);
  });
});

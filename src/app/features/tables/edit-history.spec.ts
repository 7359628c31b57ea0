import {
  EMPTY_HISTORY,
  HISTORY_LIMIT,
  applyEdit,
  historyKeyAction,
  redoEdit,
  undoEdit,
} from './edit-history';

const GRID = [
  [1, 2],
  [3, 4],
];

describe('edit history', () => {
  it('When a cell is edited, then only that cell changes and the input is untouched', () => {
    const step = applyEdit(GRID, EMPTY_HISTORY, 1, 0, 30);
    expect(step.values).toEqual([
      [1, 2],
      [30, 4],
    ]);
    expect(GRID[1][0]).toBe(3);
    expect(step.history.past).toEqual([{ row: 1, col: 0, before: 3, after: 30 }]);
  });

  it('When an edit is undone and redone, then the values go back and forth', () => {
    const edited = applyEdit(GRID, EMPTY_HISTORY, 0, 1, 20);
    const undone = undoEdit(edited.values, edited.history);
    expect(undone.values).toEqual(GRID);
    const redone = redoEdit(undone.values, undone.history);
    expect(redone.values).toEqual(edited.values);
    expect(redone.history).toEqual(edited.history);
  });

  it('When a new edit follows an undo, then nothing is left to redo', () => {
    const a = applyEdit(GRID, EMPTY_HISTORY, 0, 0, 10);
    const undone = undoEdit(a.values, a.history);
    const b = applyEdit(undone.values, undone.history, 1, 1, 40);
    expect(b.history.future).toEqual([]);
    expect(redoEdit(b.values, b.history).values).toBe(b.values);
  });

  it('When a value is set to what it was, then no edit is recorded', () => {
    expect(applyEdit(GRID, EMPTY_HISTORY, 0, 0, 1).history).toBe(EMPTY_HISTORY);
  });

  it('When there is nothing to undo or redo, then nothing changes', () => {
    expect(undoEdit(GRID, EMPTY_HISTORY).values).toBe(GRID);
    expect(redoEdit(GRID, EMPTY_HISTORY).values).toBe(GRID);
  });

  it('When more edits than the limit are made, then the oldest fall off', () => {
    let step = { values: GRID as readonly (readonly number[])[], history: EMPTY_HISTORY };
    for (let i = 0; i < HISTORY_LIMIT + 5; i++)
      step = applyEdit(step.values, step.history, 0, 0, i + 10);
    expect(step.history.past).toHaveLength(HISTORY_LIMIT);
  });

  it('When a cell off the table is edited, then it throws naming the cell', () => {
    expect(() => applyEdit(GRID, EMPTY_HISTORY, 5, 0, 1)).toThrow('cell [5, 0] is off the table');
  });
});

describe('historyKeyAction', () => {
  const key = (
    k: string,
    mods: Partial<Record<'ctrlKey' | 'metaKey' | 'shiftKey', boolean>> = {},
  ) => ({
    key: k,
    ctrlKey: false,
    metaKey: false,
    shiftKey: false,
    ...mods,
  });
  it.each([
    [key('z', { ctrlKey: true }), 'undo'],
    [key('Z', { metaKey: true }), 'undo'],
    [key('y', { ctrlKey: true }), 'redo'],
    [key('Z', { ctrlKey: true, shiftKey: true }), 'redo'],
    [key('z'), null],
    [key('y', { ctrlKey: true, shiftKey: true }), null],
    [key('c', { ctrlKey: true }), null],
  ])('When the keys are %j, then the action is %j', (event, action) => {
    expect(historyKeyAction(event)).toBe(action);
  });
});

import {
  EMPTY_HISTORY,
  HISTORY_LIMIT,
  applyBatch,
  applyEdit,
  historyActionLabels,
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
    expect(step.history.past).toEqual([
      { label: 'Set cell to 30', cells: [{ row: 1, col: 0, before: 3, after: 30 }] },
    ]);
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

  it('When a batch is applied, then one undo takes all its cells back and one redo puts them again', () => {
    const first = applyEdit(GRID, EMPTY_HISTORY, 0, 0, 9);
    const batch = applyBatch(first.values, first.history, 'Scale +5 %', [
      { row: 0, col: 1, value: 2.1 },
      { row: 1, col: 0, value: 3 }, // unchanged: left out of the batch
      { row: 1, col: 1, value: 4.2 },
    ]);
    expect(batch.values).toEqual([
      [9, 2.1],
      [3, 4.2],
    ]);
    expect(historyActionLabels(batch.history)).toEqual({
      undo: 'Undo Scale +5 % (2 cells)',
      redo: 'Redo (nothing to redo)',
    });

    const undone = undoEdit(batch.values, batch.history);
    expect(undone.values).toEqual(first.values);
    expect(historyActionLabels(undone.history)).toEqual({
      undo: 'Undo Set cell to 9 (1 cell)',
      redo: 'Redo Scale +5 % (2 cells)',
    });
    expect(redoEdit(undone.values, undone.history).values).toEqual(batch.values);
    expect(GRID).toEqual([
      [1, 2],
      [3, 4],
    ]);
  });

  it('When a batch changes nothing, then nothing is recorded', () => {
    const step = applyBatch(GRID, EMPTY_HISTORY, 'Set to 1', [{ row: 0, col: 0, value: 1 }]);
    expect(step.history).toBe(EMPTY_HISTORY);
    expect(step.values).toBe(GRID);
  });

  it('When there is no history, then the buttons say there is nothing to do', () => {
    expect(historyActionLabels(EMPTY_HISTORY)).toEqual({
      undo: 'Undo (nothing to undo)',
      redo: 'Redo (nothing to redo)',
    });
  });

  it('When a new revision opened with no edits, then undo says so and names it', () => {
    expect(historyActionLabels(EMPTY_HISTORY, 6).undo).toBe(
      'Undo (no edits yet on revision 6; earlier revisions stay saved)',
    );
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

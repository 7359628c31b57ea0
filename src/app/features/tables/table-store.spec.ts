import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { TableStore, locksStorageKey } from './table-store';
import { answerTableLoad, revisionFixture, tableFixture } from '../../../testing/table-fixtures';

const TABLE = tableFixture([1000, 2000], [30, 100]);
const REVISION = revisionFixture([
  [40, 50],
  [80, 90],
]);

describe('TableStore', () => {
  let store: TableStore;
  let http: HttpTestingController;
  let snack: jest.Mock;

  beforeEach(() => {
    localStorage.clear();
    snack = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        TableStore,
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snack } },
      ],
    });
    store = TestBed.inject(TableStore);
    http = TestBed.inject(HttpTestingController);
    store.load('t1');
    answerTableLoad(http, TABLE, REVISION);
  });

  afterEach(() => http.verify());

  it('When the table loads, then the head revision’s values are shown and nothing is dirty', () => {
    expect(store.values()).toEqual(REVISION.values);
    expect([store.busy(), store.isDirty(), store.canUndo(), store.canRedo()]).toEqual([
      null,
      false,
      false,
      false,
    ]);
  });

  it.each([
    ['abc', '“abc” is not a number. Type a VE value in percent.'],
    ['0', 'VE must be between 1 and 300 %; 0 is outside.'],
    ['301', 'VE must be between 1 and 300 %; 301 is outside.'],
    ['', 'Type a VE value between 1 and 300 %.'],
  ])('When %j is typed, then it is refused with %j and nothing changes', (raw, message) => {
    expect(store.edit(0, 1, raw)).toBe(message);
    expect(store.values()).toEqual(REVISION.values);
    expect(store.canUndo()).toBe(false);
  });

  it('When a valid value is typed, then the cell changes and can be undone and redone', () => {
    expect(store.edit(0, 1, '55,5')).toBeNull();
    expect(store.values()[0][1]).toBe(55.5);
    expect(store.isDirty()).toBe(true);

    store.undo();
    expect(store.values()).toEqual(REVISION.values);
    expect([store.isDirty(), store.canUndo(), store.canRedo()]).toEqual([false, false, true]);

    store.redo();
    expect(store.values()[0][1]).toBe(55.5);
    expect([store.canUndo(), store.canRedo()]).toEqual([true, false]);
  });

  it('When two edits are undone one by one, then they come back newest first', () => {
    store.edit(0, 0, '41');
    store.edit(1, 1, '91');
    store.undo();
    expect(store.values()).toEqual([
      [41, 50],
      [80, 90],
    ]);
    store.undo();
    expect(store.values()).toEqual(REVISION.values);
  });

  it('When the edits are saved, then the revision is posted on its parent and announced', () => {
    store.edit(1, 0, '85');
    store.save('richer at idle');

    const post = http.expectOne('/api/tables/t1/revisions');
    expect(post.request.body).toEqual({
      parentId: 'r1',
      values: [
        [40, 50],
        [85, 90],
      ],
      message: 'richer at idle',
    });
    post.flush({ ...REVISION, id: 'r2', number: 2 });

    expect(snack).toHaveBeenCalledWith('Saved as revision 2.', 'OK', { duration: 6000 });
    http.expectOne('/api/tables/t1').flush({ ...TABLE, headRevisionId: 'r2' });
    http.expectOne('/api/vehicles/v1').flush({ id: 'v1', label: 'Demo hatch' });
    http.expectOne('/api/tables/t1/revisions').flush({ items: [REVISION], total: 2 });
    http.expectOne('/api/revisions/r2').flush({ ...REVISION, id: 'r2', number: 2 });
    http.expectOne('/api/vehicles/v1/logs').flush({ items: [], total: 0 });
    expect(store.revision()?.number).toBe(2);
    expect(store.canUndo()).toBe(false);
  });

  it('When a range is selected, then its cells are listed row by row', () => {
    expect(store.selectedCells()).toEqual([]);
    store.select({ anchor: { row: 1, col: 1 }, focus: { row: 0, col: 0 } });
    expect(store.selectedCells()).toEqual([
      [0, 0],
      [0, 1],
      [1, 0],
      [1, 1],
    ]);
  });

  it('When nothing is selected, then paste, operations and locks ask for a selection', () => {
    expect(store.paste('50')).toBe('Select the cell to paste at first.');
    expect(store.operate({ kind: 'smooth' })).toBe('Select the cells to change first.');
    expect(store.setLocked(true)).toBe('Select the cells to lock first.');
  });

  it('When a block is pasted, then it is one undo step and a bad block changes nothing', () => {
    store.select({ anchor: { row: 0, col: 0 }, focus: { row: 0, col: 0 } });
    expect(store.paste('41\t51\r\n81\t91\r\n')).toBeNull();
    expect(store.values()).toEqual([
      [41, 51],
      [81, 91],
    ]);
    expect(store.historyLabels().undo).toBe('Undo Paste 2 × 2 values (4 cells)');
    store.undo();
    expect(store.values()).toEqual(REVISION.values);

    expect(store.paste('41\t51\t61')).toContain('runs 1 column off the table');
    expect(store.paste('41\tx')).toBe(
      'Row 1, column 2 of the pasted text, “x”, is not a number. Nothing was pasted.',
    );
    expect(store.values()).toEqual(REVISION.values);
  });

  it('When an operation runs on the selection, then it is one undo step with its label', () => {
    store.select({ anchor: { row: 0, col: 0 }, focus: { row: 1, col: 1 } });
    expect(store.operate({ kind: 'offset', points: 1.5 })).toBeNull();
    expect(store.values()).toEqual([
      [41.5, 51.5],
      [81.5, 91.5],
    ]);
    expect(store.historyLabels().undo).toBe('Undo Offset +1.5 VE (4 cells)');
    store.undo();
    expect(store.values()).toEqual(REVISION.values);
    expect(store.operate({ kind: 'scale', percent: 0 })).toBe('Scale +0 % changed no cell.');
    expect(store.canUndo()).toBe(false);
  });

  it('When cells are locked, then edits and operations leave them and the locks survive a reload', () => {
    store.select({ anchor: { row: 1, col: 1 }, focus: { row: 1, col: 1 } });
    expect(store.setLocked(true)).toBe('Locked 1 cell: nothing changes them until unlocked.');
    expect(store.lockedCells()).toEqual([[1, 1]]);
    expect(localStorage.getItem(locksStorageKey('t1'))).toBe('[[1,1]]');
    expect(store.edit(1, 1, '95')).toBe(
      'The cell at 2000 rpm, 100 kPa is locked. Unlock it to edit.',
    );

    store.select({ anchor: { row: 0, col: 0 }, focus: { row: 1, col: 1 } });
    expect(store.operate({ kind: 'set', value: 60 })).toBeNull();
    expect(store.values()).toEqual([
      [60, 60],
      [60, 90],
    ]);

    store.load('t1');
    answerTableLoad(http, TABLE, REVISION);
    expect(store.lockedCells()).toEqual([[1, 1]]);
    expect(store.selectedCells()).toHaveLength(4);

    expect(store.setLocked(false)).toBe('Unlocked 4 cells.');
    expect(store.lockedCells()).toEqual([]);
  });
});

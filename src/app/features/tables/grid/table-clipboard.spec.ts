import { cellKey } from './cell-range';
import { formatTsv, parseTsv, pasteText, planPaste, plainNumber } from './table-clipboard';

const VALUES = [
  [40, 42, 44],
  [50, 52, 54],
  [60, 62, 64],
];
const NONE = new Set<string>();

describe('formatTsv', () => {
  it.each([
    [95.5, '95.5'],
    [101, '101'],
    [0.0125, '0.0125'],
    [1e-9, '0'],
    [-0.0000001, '0'],
    [62.123456789, '62.123457'],
  ])('When the number is %d, then it is written plainly as %j', (value, text) => {
    expect(plainNumber(value)).toBe(text);
  });

  it('When cells are copied, then columns are split by tabs and rows by CRLF, blanks empty', () => {
    expect(
      formatTsv([
        [40, 42.5],
        [null, 1e3],
      ]),
    ).toBe('40\t42.5\r\n\t1000');
  });
});

describe('parseTsv', () => {
  it.each([
    [
      '40\t42\r\n50\t52\r\n',
      [
        [40, 42],
        [50, 52],
      ],
    ],
    [
      '40\t42\n50\t52',
      [
        [40, 42],
        [50, 52],
      ],
    ],
    [
      '40\t42\r50\t52\n\n',
      [
        [40, 42],
        [50, 52],
      ],
    ],
    [' 95,5 \t 96.25 ', [[95.5, 96.25]]],
    ['95 %\t96%', [[95, 96]]],
    ['62.345', [[62.35]]],
    ['+7', [[7]]],
  ])('When %j is pasted, then it reads %j', (text, rows) => {
    expect(parseTsv(text)).toEqual({ ok: true, rows });
  });

  it.each([
    ['', 'The clipboard holds no values to paste. Nothing was pasted.'],
    [
      '40\t42\n50',
      'Row 2 of the pasted text has 1 values, row 1 has 2: paste a rectangular block. Nothing was pasted.',
    ],
    ['40\t\n50\t52', 'Row 1, column 2 of the pasted text is empty. Nothing was pasted.'],
    [
      '40\t42\n50\tabc',
      'Row 2, column 2 of the pasted text, “abc”, is not a number. Nothing was pasted.',
    ],
    [
      '95,5,96',
      'Row 1, column 1 of the pasted text, “95,5,96”, is not a number. Nothing was pasted.',
    ],
    ['40\t350', 'Row 1, column 2 of the pasted text, 350, is outside 1–300 %. Nothing was pasted.'],
    ['0,5', 'Row 1, column 1 of the pasted text, 0.5, is outside 1–300 %. Nothing was pasted.'],
  ])('When %j is pasted, then it is refused: %j', (text, message) => {
    expect(parseTsv(text)).toEqual({ ok: false, message });
  });
});

describe('planPaste', () => {
  it('When a block is pasted, then it lands from the top-left of the selection', () => {
    const plan = planPaste(
      { values: VALUES, bounds: { r0: 1, r1: 2, c0: 1, c1: 2 }, locked: NONE },
      [
        [70, 54],
        [71, 72],
      ],
    );
    // 54 is already there: it is left out of the changes.
    expect(plan).toEqual({
      ok: true,
      changes: [
        { row: 1, col: 1, value: 70 },
        { row: 2, col: 1, value: 71 },
        { row: 2, col: 2, value: 72 },
      ],
      skippedLocked: 0,
    });
  });

  it('When one value is pasted, then it fills the whole selection, locked cells skipped', () => {
    const plan = planPaste(
      { values: VALUES, bounds: { r0: 0, r1: 1, c0: 0, c1: 1 }, locked: new Set([cellKey(0, 1)]) },
      [[80]],
    );
    expect(plan).toEqual({
      ok: true,
      changes: [
        { row: 0, col: 0, value: 80 },
        { row: 1, col: 0, value: 80 },
        { row: 1, col: 1, value: 80 },
      ],
      skippedLocked: 1,
    });
  });

  it('When the block runs off the table, then it is refused saying by how much', () => {
    const plan = planPaste(
      { values: VALUES, bounds: { r0: 2, r1: 2, c0: 1, c1: 1 }, locked: NONE },
      [
        [1, 2, 3],
        [4, 5, 6],
      ],
    );
    expect(plan).toEqual({
      ok: false,
      message:
        'The pasted block is 2 × 3 cells: from row 3, column 2 it runs 1 row and 1 column off the table. Select a cell further up or left. Nothing was pasted.',
    });
  });
});

describe('pasteText', () => {
  it('When locked cells are skipped, then the note says how many, and the label the block', () => {
    const outcome = pasteText(
      {
        values: VALUES,
        bounds: { r0: 0, r1: 0, c0: 0, c1: 0 },
        locked: new Set([cellKey(0, 0), cellKey(1, 1)]),
      },
      '70\t71\n72\t73\n',
    );
    expect(outcome).toMatchObject({
      ok: true,
      label: 'Paste 2 × 2 values',
      note: 'Pasted 2 cells; 2 locked cells were skipped.',
    });
  });

  it('When the values are already there, then the note says so', () => {
    const target = { values: VALUES, bounds: { r0: 0, r1: 0, c0: 0, c1: 0 }, locked: NONE };
    expect(pasteText(target, '40')).toMatchObject({
      ok: true,
      changes: [],
      note: 'The pasted values are already in those cells.',
    });
  });
});

import { type CellBounds, type CellSet, boundsSize, cellKey } from './cell-range';
import type { CellChange } from './edit-history';
import { VE_RANGE } from './ve-input';

/**
 * A number as a spreadsheet reads it back: decimal point, no grouping, no exponent, at most six
 * decimals and no trailing zeros ("95.5", "101", "0.0125").
 */
export function plainNumber(value: number): string {
  const rounded = Number(value.toFixed(6));
  return String(Object.is(rounded, -0) ? 0 : rounded);
}

/**
 * Cells as tab-separated text for the clipboard: columns by tabs, rows by CRLF (what desktop
 * spreadsheets write; every spreadsheet also reads it), no trailing line break, an empty field
 * where a cell has no number.
 */
export function formatTsv(grid: readonly (readonly (number | null)[])[]): string {
  return grid
    .map((row) => row.map((v) => (v === null || !Number.isFinite(v) ? '' : plainNumber(v))))
    .map((fields) => fields.join('\t'))
    .join('\r\n');
}

/** The outcome of reading pasted text. */
export type TsvParse =
  | { readonly ok: true; readonly rows: number[][] }
  | { readonly ok: false; readonly message: string };

/**
 * One field: digits with at most one decimal separator, an optional sign and an optional "%".
 * A comma is always a decimal comma. That is safe in tab-separated text: tabs separate the
 * columns, so a comma can never be one; and VE stops at 300, so no value needs a thousands
 * separator. A field with two separators ("95,5,96": comma-separated text) is not a number.
 */
const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)\s*%?$/;

const REFUSED = 'Nothing was pasted.';

/**
 * Reads tab-separated text copied from a spreadsheet: rows by CRLF, LF or CR, trailing line
 * breaks ignored, blanks around fields trimmed. Every field must be a VE value within
 * VE_RANGE; values are rounded to 0.01 as revisions store them. The first bad field is named by
 * its row and column in the pasted text (from 1), and nothing is taken.
 */
export function parseTsv(text: string): TsvParse {
  const body = text.replace(/[\r\n]+$/, '');
  if (body.trim() === '') {
    return { ok: false, message: `The clipboard holds no values to paste. ${REFUSED}` };
  }
  const lines = body.split(/\r\n|\n|\r/).map((line) => line.split('\t'));
  const width = lines[0].length;
  const rows: number[][] = [];
  for (let r = 0; r < lines.length; r++) {
    const fields = lines[r];
    if (fields.length !== width) {
      const message =
        `Row ${r + 1} of the pasted text has ${fields.length} values, row 1 has ${width}: ` +
        `paste a rectangular block. ${REFUSED}`;
      return { ok: false, message };
    }
    const row: number[] = [];
    for (let c = 0; c < width; c++) {
      const field = fields[c].trim();
      const where = `Row ${r + 1}, column ${c + 1} of the pasted text`;
      if (field === '') return { ok: false, message: `${where} is empty. ${REFUSED}` };
      if (!NUMBER.test(field)) {
        return { ok: false, message: `${where}, “${field}”, is not a number. ${REFUSED}` };
      }
      const value = Number(field.replace('%', '').trim().replace(',', '.'));
      if (value < VE_RANGE.min || value > VE_RANGE.max) {
        const range = `${VE_RANGE.min}–${VE_RANGE.max} %`;
        return { ok: false, message: `${where}, ${value}, is outside ${range}. ${REFUSED}` };
      }
      row.push(Math.round(value * 100) / 100);
    }
    rows.push(row);
  }
  return { ok: true, rows };
}

/** What a paste would change. */
export type PastePlan =
  | { readonly ok: true; readonly changes: CellChange[]; readonly skippedLocked: number }
  | { readonly ok: false; readonly message: string };

/** Where and onto what a paste lands. */
export interface PasteTarget {
  /** The table's values, `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /** The selection; the block lands on its top-left cell. */
  readonly bounds: CellBounds;
  /** Locked cells: never written, counted as skipped. */
  readonly locked: CellSet;
}

/**
 * Where pasted rows go: from the selection's top-left cell, or, for a single pasted value, into
 * every selected cell. A block that runs off the table is refused whole. Locked cells are
 * skipped and counted; cells that already hold the value are left out of the changes.
 */
export function planPaste(target: PasteTarget, clip: readonly (readonly number[])[]): PastePlan {
  const { values, bounds, locked } = target;
  const tableRows = values.length;
  const tableCols = values[0]?.length ?? 0;
  const isSingle = clip.length === 1 && clip[0].length === 1;
  const size = isSingle ? boundsSize(bounds) : { rows: clip.length, cols: clip[0].length };
  const overRows = bounds.r0 + size.rows - tableRows;
  const overCols = bounds.c0 + size.cols - tableCols;
  if (overRows > 0 || overCols > 0) {
    const over = [
      overRows > 0 ? `${overRows} ${overRows === 1 ? 'row' : 'rows'}` : '',
      overCols > 0 ? `${overCols} ${overCols === 1 ? 'column' : 'columns'}` : '',
    ].filter(Boolean);
    const message =
      `The pasted block is ${size.rows} × ${size.cols} cells: from row ${bounds.r0 + 1}, ` +
      `column ${bounds.c0 + 1} it runs ${over.join(' and ')} off the table. ` +
      `Select a cell further up or left. ${REFUSED}`;
    return { ok: false, message };
  }
  const changes: CellChange[] = [];
  let skippedLocked = 0;
  for (let i = 0; i < size.rows; i++) {
    for (let j = 0; j < size.cols; j++) {
      const row = bounds.r0 + i;
      const col = bounds.c0 + j;
      if (locked.has(cellKey(row, col))) {
        skippedLocked++;
        continue;
      }
      const value = isSingle ? clip[0][0] : clip[i][j];
      if (values[row][col] !== value) changes.push({ row, col, value });
    }
  }
  return { ok: true, changes, skippedLocked };
}

/** The label of a paste in the undo history. */
export function pasteLabel(rows: number, cols: number): string {
  return rows * cols === 1 ? 'Paste 1 value' : `Paste ${rows} × ${cols} values`;
}

/** A paste ready to commit: its history label, the changes and what to tell the user. */
export type PasteOutcome =
  | {
      readonly ok: true;
      /** The label of the undo step. */
      readonly label: string;
      /** The cells to change. */
      readonly changes: CellChange[];
      /** What to tell the user (locked cells skipped, nothing new), or null. */
      readonly note: string | null;
    }
  | { readonly ok: false; readonly message: string };

/** Reads pasted text and plans where it lands (`parseTsv` then `planPaste`). */
export function pasteText(target: PasteTarget, text: string): PasteOutcome {
  const parsed = parseTsv(text);
  if (!parsed.ok) return parsed;
  const plan = planPaste(target, parsed.rows);
  if (!plan.ok) return plan;
  const label = pasteLabel(parsed.rows.length, parsed.rows[0].length);
  const skipped = plan.skippedLocked;
  const n = plan.changes.length;
  let note: string | null = null;
  if (skipped > 0) {
    const locked = skipped === 1 ? '1 locked cell was' : `${skipped} locked cells were`;
    note = `Pasted ${n} ${n === 1 ? 'cell' : 'cells'}; ${locked} skipped.`;
  } else if (n === 0) {
    note = 'The pasted values are already in those cells.';
  }
  return { ok: true, label, changes: plan.changes, note };
}

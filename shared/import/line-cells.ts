import type { DecimalMark, Newline } from './column-mapping';

// Exact powers of ten (all below 2^53, so exact doubles), as in parseDecimal's fast path.
const POW10 = Array.from({ length: 16 }, (_, k) => 10 ** k);

/**
 * Reads the cells of unquoted CSV lines in one pass over the text's bytes, without making a
 * string per cell (at a million rows those strings cost more in garbage collection than the
 * parse itself). The text must be ASCII, so that byte offsets are character offsets; bytes are
 * also quicker to read than a string's characters.
 *
 * Each wanted column has a slot. A slot gets the cell's bounds and, when the cell is a plain
 * number that `parseDecimal`'s fast path takes (optional sign, at most 15 digits, one decimal
 * mark, nothing else), its value — computed the same way, so it is the same double. Any other
 * cell (a missing one is empty) gets NaN, and the caller reads its text as the row-wise import
 * would.
 */
export class LineCells {
  /** Where each slot's cell starts in the text. */
  readonly starts: Int32Array;
  /** Where each slot's cell ends in the text, exclusive. */
  readonly ends: Int32Array;
  /** Whether every slot of the last line scanned got a plain number. */
  isPlain = false;
  private readonly slots: Int32Array;
  private readonly values: Float64Array;
  private readonly delimiterCode: number;
  private readonly markCode: number;
  private readonly breakCode: number;
  private readonly isCrLf: boolean;

  /**
   * `slots[c]` is where column c's value goes in `values` (−1: not wanted); each slot is fed by
   * one column. `values` is written by {@link scan}, one entry per slot.
   */
  constructor(
    slots: Int32Array,
    values: Float64Array,
    delimiter: string,
    decimal: DecimalMark,
    newline: Newline,
  ) {
    if (delimiter.length !== 1) throw new Error('LineCells: delimiter must be one character');
    if (delimiter === decimal) throw new Error('LineCells: delimiter and decimal mark clash');
    this.slots = Int32Array.from(slots);
    this.values = values;
    this.starts = new Int32Array(values.length);
    this.ends = new Int32Array(values.length);
    this.delimiterCode = delimiter.charCodeAt(0);
    this.markCode = decimal.charCodeAt(0);
    this.breakCode = newline.charCodeAt(0);
    this.isCrLf = newline === '\r\n';
  }

  /**
   * Scans the line that starts at `start` and ends at the next line break or at `limit`, and
   * returns where it ends (the start of its line break, or `limit`).
   */
  scan(bytes: Uint8Array, start: number, limit: number): number {
    const { slots, starts, ends, values, delimiterCode: delimiter, markCode: mark } = this;
    const { breakCode, isCrLf } = this;
    const columns = slots.length;
    let isPlain = true;
    let p = start;
    for (let c = 0; ; c++) {
      const slot = c < columns ? slots[c] : -1;
      let i = p;
      let code = i < limit ? bytes[i] : -1;
      if (slot >= 0) {
        const isNegative = code === 45;
        if (isNegative || code === 43) i++;
        // Digits, then a decimal mark and more digits: the mantissa is exact up to 15 digits.
        let mantissa = 0;
        const integerStart = i;
        for (; i < limit; i++) {
          code = bytes[i];
          if (code < 48 || code > 57) break;
          mantissa = mantissa * 10 + (code - 48);
        }
        let digits = i - integerStart;
        let fractionDigits = 0;
        if (i < limit && code === mark) {
          const fractionStart = ++i;
          for (; i < limit; i++) {
            code = bytes[i];
            if (code < 48 || code > 57) break;
            mantissa = mantissa * 10 + (code - 48);
          }
          fractionDigits = i - fractionStart;
          digits += fractionDigits;
        }
        let value = NaN;
        if (i === limit || code === delimiter || isBreak(bytes, i, code, breakCode, isCrLf)) {
          if (digits > 0 && digits <= 15) {
            const magnitude =
              fractionDigits === 0 ? mantissa : mantissa / (POW10[fractionDigits] as number);
            value = isNegative ? -magnitude : magnitude;
          }
        } else i = this.cellEnd(bytes, i, limit);
        if (Number.isNaN(value)) isPlain = false;
        values[slot] = value;
        starts[slot] = p;
        ends[slot] = i;
      } else i = this.cellEnd(bytes, i, limit);
      if (i === limit || bytes[i] !== delimiter) {
        // The line has no more cells: the wanted columns beyond it read as empty.
        for (let d = c + 1; d < columns; d++) {
          const missing = slots[d] as number;
          if (missing < 0) continue;
          values[missing] = NaN;
          isPlain = false;
          starts[missing] = i;
          ends[missing] = i;
        }
        this.isPlain = isPlain;
        return i;
      }
      p = i + 1;
    }
  }

  /** Where the cell that goes on at `from` ends: at a delimiter, a line break or `limit`. */
  private cellEnd(bytes: Uint8Array, from: number, limit: number): number {
    const { delimiterCode, breakCode, isCrLf } = this;
    let i = from;
    for (; i < limit; i++) {
      const code = bytes[i];
      if (code === delimiterCode || isBreak(bytes, i, code, breakCode, isCrLf)) break;
    }
    return i;
  }
}

/** Whether a line break starts at `at`, whose byte is `code`. */
function isBreak(
  bytes: Uint8Array,
  at: number,
  code: number,
  breakCode: number,
  isCrLf: boolean,
): boolean {
  return code === breakCode && (!isCrLf || bytes[at + 1] === 10);
}

/**
 * Whether the ASCII line `bytes[start, end)` is blank as the row-wise import sees it: every cell
 * empty once trimmed, that is only delimiters, spaces, tabs and other ASCII line-space.
 */
export function isBlankLine(
  bytes: Uint8Array,
  start: number,
  end: number,
  delimiterCode: number,
): boolean {
  for (let i = start; i < end; i++) {
    const code = bytes[i];
    if (code !== delimiterCode && code !== 32 && !(code >= 9 && code <= 13)) return false;
  }
  return true;
}

// Encoding is a standard web API (browsers and Node alike), and far quicker than reading the
// string character by character.
const encoder = new TextEncoder();

/**
 * The bytes of `text` written into `buffer` (which must hold `text.length` bytes), or null when
 * the text is not all ASCII: then bytes and characters would not line up.
 */
export function encodeAscii(text: string, buffer: Uint8Array): Uint8Array | null {
  const bytes = buffer.subarray(0, text.length);
  // A non-ASCII character takes more bytes than UTF-16 units, so it cannot all fit.
  return encoder.encodeInto(text, bytes).read === text.length ? bytes : null;
}

/**
 * Where the next line break of the ASCII text `bytes` starts at or after `from`, splitting as
 * `split(newline)` does, or -1 when there is none.
 */
export function findLineBreak(bytes: Uint8Array, from: number, newline: Newline): number {
  const first = newline.charCodeAt(0);
  if (newline.length === 1) return bytes.indexOf(first, from);
  for (let at = bytes.indexOf(first, from); at >= 0; at = bytes.indexOf(first, at + 1)) {
    if (bytes[at + 1] === 10) return at;
  }
  return -1;
}

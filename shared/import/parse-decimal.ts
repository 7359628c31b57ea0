import type { DecimalMark } from './column-mapping';

// A plain decimal number, optionally signed, with an optional exponent. Anything else (hex,
// "Infinity", thousands separators, units glued to the number) is not a number here, because
// Number() would accept some of those silently.
const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

// Exact powers of ten (all below 2^53, so exact doubles) for the fast path.
const POW10 = Array.from({ length: 16 }, (_, k) => 10 ** k);

/**
 * The number a CSV cell holds with the given decimal mark, or NaN when it holds none (empty
 * cells included). Surrounding spaces are ignored.
 */
export function parseDecimal(text: string, decimal: DecimalMark = '.'): number {
  const n = text.length;
  if (n === 0) return NaN;
  // Fast path for the usual cell ("-123.45", at most 15 digits, no exponent): the digits form
  // an exact integer and one division by an exact power of ten is correctly rounded, so the
  // result equals Number()'s. Being called for every cell of a file, it avoids Number()'s
  // general string scan and any allocation.
  const mark = decimal === ',' ? 44 : 46;
  let i = 0;
  let code = text.charCodeAt(0);
  const isNegative = code === 45;
  if (isNegative || code === 43) i = 1;
  let mantissa = 0;
  let digits = 0;
  let fractionDigits = 0;
  let hasMark = false;
  for (; i < n; i++) {
    code = text.charCodeAt(i);
    if (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      digits++;
      if (hasMark) fractionDigits++;
    } else if (code === mark && !hasMark) hasMark = true;
    else break;
  }
  if (i === n && digits > 0 && digits <= 15) {
    const value = mantissa / (POW10[fractionDigits] as number);
    return isNegative ? -value : value;
  }
  const trimmed = (decimal === ',' ? text.replace(',', '.') : text).trim();
  return PLAIN_NUMBER.test(trimmed) && Number.isFinite(Number(trimmed)) ? Number(trimmed) : NaN;
}

/** Whether a CSV cell holds a number with either decimal mark (for sniffing). */
export function looksNumeric(text: string): boolean {
  const t = text.trim();
  return t !== '' && PLAIN_NUMBER.test(t.replace(',', '.'));
}

/**
 * The VE range a cell may hold, in percent. The same as MIN_VE / MAX_VE of
 * `@shared/contracts/tables`, which cannot be imported here without pulling zod into the
 * client bundle; `ve-input.spec.ts` checks that the two agree.
 */
export const VE_RANGE = { min: 1, max: 300 } as const;

/** The outcome of reading what a user typed into a VE cell. */
export type VeInput = { ok: true; value: number } | { ok: false; message: string };

/**
 * Reads a typed VE value: a plain number in percent (a decimal comma is accepted), within
 * VE_RANGE, rounded to 0.01 as revisions store it. Anything else is refused with a sentence
 * saying what is wanted.
 */
export function parseVeInput(raw: unknown): VeInput {
  const { min, max } = VE_RANGE;
  const text = typeof raw === 'number' ? String(raw) : typeof raw === 'string' ? raw.trim() : '';
  if (text === '') return { ok: false, message: `Type a VE value between ${min} and ${max} %.` };
  if (!/^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/.test(text)) {
    return { ok: false, message: `“${text}” is not a number. Type a VE value in percent.` };
  }
  const value = Number(text.replace(',', '.'));
  if (value < min || value > max) {
    return { ok: false, message: `VE must be between ${min} and ${max} %; ${value} is outside.` };
  }
  return { ok: true, value: Math.round(value * 100) / 100 };
}

import { parseTableFile, type TableFileResult } from '@shared/table-file/parse-table-file';
import { isTableFileError } from '@shared/table-file/table-file-error';
import type { TableOrientation } from '@shared/table-file/table-labels';

/** A table ready to create: its axes and values, or why it is not ready. */
export type DraftTable =
  | {
      readonly ok: true;
      readonly rpmAxis: number[];
      readonly mapAxisKpa: number[];
      readonly values: number[][];
      /** What the reader decided and what to look at, in words. */
      readonly notes: string[];
      /** A name the file suggests (its title line), if any. */
      readonly title: string | null;
    }
  | { readonly ok: false; readonly message: string };

/** The pressure units a file's MAP axis may be in. */
export type FilePressureUnit = 'auto' | 'kPa' | 'psi' | 'bar' | 'inHg';

/**
 * Reads a table file or a pasted block with its axes (see `parseTableFile`): the draft to create,
 * or the reader's refusal with the row and column it applies to.
 */
export function draftFromText(
  text: string,
  orientation: TableOrientation | 'auto',
  pressureUnit: FilePressureUnit,
): DraftTable {
  let result: TableFileResult;
  try {
    result = parseTableFile(text, { orientation, pressureUnit });
  } catch (err) {
    // The reader refuses with a TableFileError; anything else is a defect and goes on up.
    if (!isTableFileError(err)) throw err;
    // The reader's message names the row and column (from 0, as the API's file errors do).
    return { ok: false, message: err.message };
  }
  return {
    ok: true,
    rpmAxis: result.rpmAxis,
    mapAxisKpa: result.mapAxisKpa,
    values: result.values,
    notes: [result.orientationReason, `MAP read in ${result.pressureUnit}.`, ...result.warnings],
    title: result.title,
  };
}

/** A list of breakpoints typed as "500, 1000, 1500" (spaces, commas or semicolons between). */
export function parseBreakpoints(text: string, what: string): number[] | string {
  const parts = text
    .split(/[\s,;]+/)
    .map((p) => p.trim())
    .filter((p) => p !== '');
  if (parts.length < 2) return `${what}: give at least 2 breakpoints`;
  if (parts.length > 64) return `${what}: at most 64 breakpoints`;
  const values = parts.map(Number);
  const bad = values.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) return `${what}: "${parts[bad]}" is not a number`;
  for (let i = 1; i < values.length; i++) {
    if (!((values[i] as number) > (values[i - 1] as number))) {
      return `${what}: breakpoints must rise (${values[i]} after ${values[i - 1]})`;
    }
  }
  return values;
}

/** The shape a table starts from when built from axes. */
export type StartShape = 'flat' | 'rising';

/**
 * A table from typed axes and a starting estimate: `flat` puts `ve` in every cell; `rising`
 * starts at 60 % of `ve` at the lowest MAP and reaches `ve` at the highest, the usual way VE
 * grows with load, so the first logs correct a plausible table rather than a flat one. The
 * tuner's own estimate, not a measurement: the first analysis replaces it cell by cell.
 */
export function draftFromAxes(
  rpmText: string,
  mapText: string,
  ve: number,
  shape: StartShape,
): DraftTable {
  const rpmAxis = parseBreakpoints(rpmText, 'RPM');
  if (typeof rpmAxis === 'string') return { ok: false, message: rpmAxis };
  const mapAxisKpa = parseBreakpoints(mapText, 'MAP');
  if (typeof mapAxisKpa === 'string') return { ok: false, message: mapAxisKpa };
  if (!(ve >= 1 && ve <= 300)) return { ok: false, message: 'The starting VE must be 1–300 %' };
  if ((rpmAxis[0] as number) < 0 || (rpmAxis.at(-1) as number) > 30000) {
    return { ok: false, message: 'RPM breakpoints must lie within 0–30000' };
  }
  if ((mapAxisKpa[0] as number) < 1 || (mapAxisKpa.at(-1) as number) > 1000) {
    return { ok: false, message: 'MAP breakpoints must lie within 1–1000 kPa' };
  }
  const low = mapAxisKpa[0] as number;
  const span = (mapAxisKpa.at(-1) as number) - low;
  const values = mapAxisKpa.map((map) => {
    const share = shape === 'flat' ? 1 : 0.6 + (0.4 * (map - low)) / span;
    return rpmAxis.map(() => Math.round(ve * share * 100) / 100);
  });
  return { ok: true, rpmAxis, mapAxisKpa, values, notes: [], title: null };
}

/** RPM breakpoints to suggest: 500 rpm steps up to 7000 (edit for the engine's redline). */
export const SUGGESTED_RPM =
  '500, 1000, 1500, 2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500, 6000, 6500, 7000';
/** MAP breakpoints to suggest for a naturally aspirated engine, kPa absolute. */
export const SUGGESTED_MAP_NA = '20, 30, 40, 50, 60, 70, 80, 90, 100, 105';
/** MAP breakpoints to suggest for a boosted engine, kPa absolute (to 2 bar of boost). */
export const SUGGESTED_MAP_BOOSTED =
  '20, 30, 40, 50, 60, 70, 80, 90, 100, 120, 140, 160, 180, 200, 250, 300';

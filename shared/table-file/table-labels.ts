import { parseUnitText } from '../import/parse-unit-text';
import type { PressureUnit } from '../units/units';
import { labelParts, type TableLayout } from './read-table-layout';
import { TableFileError } from './table-file-error';

/** Which way a table file runs: MAP breakpoints down the first column, or RPM ones. */
export type TableOrientation = 'map-rows' | 'rpm-rows';

/** What the file's labels say about the orientation, and which label said it. */
export interface OrientationHint {
  readonly orientation: TableOrientation;
  readonly source: string;
}

/** A pressure unit the file's labels name, and where. */
export interface LabelledPressureUnit {
  readonly unit: PressureUnit;
  readonly source: string;
  readonly row: number;
}

const PRESSURE_UNITS: ReadonlySet<string> = new Set(['kPa', 'psi', 'bar', 'inHg']);
const PRESSURE_WORDS = /map|kpa|psi|bar|inhg|pressure|boost|load/;
const SPEED_WORDS = /rpm|speed|rev/;

/** What one half of a `rows\columns` label names: engine speed, pressure, or neither. */
function axisWord(text: string): 'rpm' | 'map' | null {
  const t = text.toLowerCase();
  const speed = SPEED_WORDS.test(t);
  const pressure = PRESSURE_WORDS.test(t);
  if (speed === pressure) return null;
  return speed ? 'rpm' : 'map';
}

/**
 * The orientation a `rows\columns` label states (our export's corner is `map_kpa\rpm`: rows
 * before the backslash), or null when the text is not such a label.
 */
function orientationOfLabel(text: string): TableOrientation | null {
  const halves = text.split(/[\\/|]/);
  if (halves.length !== 2) return null;
  const rows = axisWord(halves[0] as string);
  const columns = axisWord(halves[1] as string);
  if (rows === 'map' && columns === 'rpm') return 'map-rows';
  if (rows === 'rpm' && columns === 'map') return 'rpm-rows';
  return null;
}

/** The orientation the corner cell or the units row's first cell states, else null. */
export function orientationHint(layout: TableLayout): OrientationHint | null {
  const fromCorner = orientationOfLabel(layout.corner);
  if (fromCorner) return { orientation: fromCorner, source: `the corner cell "${layout.corner}"` };
  const first = layout.unitsRow?.cells[0] ?? '';
  if (first === '') return null;
  const source = `the units row's first cell "${first}"`;
  const fromLabel = orientationOfLabel(first);
  if (fromLabel) return { orientation: fromLabel, source };
  // A single unit under the corner names the first column's axis.
  const unit = parseUnitText(first)?.unit;
  if (unit === 'rpm') return { orientation: 'rpm-rows', source };
  if (unit !== undefined && PRESSURE_UNITS.has(unit)) return { orientation: 'map-rows', source };
  return null;
}

/** Pressure units named in some label texts of one line; throws on a gauge unit. */
function pressureUnitsIn(texts: readonly string[], row: number): Set<PressureUnit> {
  const found = new Set<PressureUnit>();
  for (const text of texts) {
    const reading = parseUnitText(text);
    if (!reading || !PRESSURE_UNITS.has(reading.unit)) continue;
    if (reading.reference === 'gauge') {
      throw new TableFileError(
        'gauge_pressure',
        `Row ${row} gives the pressure as gauge ("${text}"): a VE table's MAP axis is absolute ` +
          `pressure, and gauge cannot be turned into it without the barometer. Give the ` +
          `breakpoints as absolute pressure.`,
        { row },
      );
    }
    found.add(reading.unit as PressureUnit);
  }
  return found;
}

/** Words of free text, for a unit inside a title or a label such as `map_kpa` or `MAP (psi)`. */
function wordsOf(text: string): string[] {
  return text.split(/[^A-Za-z0-9"]+/).filter((w) => w !== '');
}

/**
 * The pressure units the file's labels name, most trusted first: the units row, then the
 * corner cell, then the title lines. Each source gives at most one unit; a source naming two
 * different ones is refused, since either guess could scale the axis wrongly.
 */
export function labelledPressureUnits(layout: TableLayout): LabelledPressureUnit[] {
  const sources: { source: string; row: number; texts: string[] }[] = [];
  if (layout.unitsRow) {
    const texts = layout.unitsRow.cells.flatMap(labelParts);
    sources.push({
      source: `the units row (row ${layout.unitsRow.row})`,
      row: layout.unitsRow.row,
      texts,
    });
  }
  sources.push({
    source: `the corner cell "${layout.corner}"`,
    row: layout.headerRow,
    texts: [...labelParts(layout.corner), ...wordsOf(layout.corner)],
  });
  for (const title of layout.titles) {
    sources.push({
      source: `the label on row ${title.row}`,
      row: title.row,
      texts: wordsOf(title.text),
    });
  }
  const out: LabelledPressureUnit[] = [];
  for (const { source, row, texts } of sources) {
    const units = [...pressureUnitsIn(texts, row)];
    if (units.length > 1) {
      throw new TableFileError(
        'ambiguous_pressure_unit',
        `${source} names more than one pressure unit (${units.join(', ')}): say which one the ` +
          `MAP breakpoints use.`,
        { row },
      );
    }
    if (units.length === 1) out.push({ unit: units[0] as PressureUnit, source, row });
  }
  return out;
}

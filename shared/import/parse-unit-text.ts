import type { ChannelUnit } from './column-mapping';

/** Whether a pressure is written relative to vacuum, to the atmosphere, or does not say. */
export type PressureReference = 'absolute' | 'gauge' | null;

/**
 * A unit read from text: the API unit, whether a pressure said gauge or absolute, or `flag`
 * for on/off markers such as `CL=1` or `0/1`.
 */
export interface UnitReading {
  /** The unit in the API's spelling, or `flag` for 0/1 channels. */
  readonly unit: ChannelUnit | 'flag';
  /** For pressures: the reference the text states, null when it does not say. */
  readonly reference: PressureReference;
}

/**
 * Unit spellings met in logs, in a single table. Keys are compared after {@link normaliseUnit}
 * (lower case, no brackets, degree signs kept apart from the letter).
 */
const UNIT_SPELLINGS: ReadonlyArray<readonly [readonly string[], UnitReading]> = [
  [['s', 'sec', 'secs', 'second', 'seconds'], { unit: 's', reference: null }],
  [['ms', 'msec', 'millisecond', 'milliseconds'], { unit: 'ms', reference: null }],
  [['rpm', 'rev/min', '1/min', 'r/min', 'revs'], { unit: 'rpm', reference: null }],
  [['kpa', 'kilopascal'], { unit: 'kPa', reference: null }],
  [['kpaa', 'kpa abs', 'kpa a', 'kpa absolute'], { unit: 'kPa', reference: 'absolute' }],
  [['kpag', 'kpa g', 'kpa gauge'], { unit: 'kPa', reference: 'gauge' }],
  [['psi', 'lb/in2', 'lbf/in2', 'lb/in²'], { unit: 'psi', reference: null }],
  [['psia', 'psi abs', 'psi a'], { unit: 'psi', reference: 'absolute' }],
  [['psig', 'psi g', 'psi gauge'], { unit: 'psi', reference: 'gauge' }],
  [['bar'], { unit: 'bar', reference: null }],
  [['bara', 'bar abs', 'bar a'], { unit: 'bar', reference: 'absolute' }],
  [['barg', 'bar g', 'bar gauge'], { unit: 'bar', reference: 'gauge' }],
  [['inhg', 'in hg', 'in.hg', '"hg', 'inches hg'], { unit: 'inHg', reference: null }],
  [['c', '° c', 'degc', 'deg c', 'celsius', '℃'], { unit: 'C', reference: null }],
  [['f', '° f', 'degf', 'deg f', 'fahrenheit', '℉'], { unit: 'F', reference: null }],
  [['k', 'kelvin'], { unit: 'K', reference: null }],
  [['%', 'pct', 'percent'], { unit: '%', reference: null }],
  [['afr', 'a/f', 'air/fuel', 'air fuel', 'afr mass'], { unit: 'afr', reference: null }],
  [['lambda', 'λ', 'lam'], { unit: 'lambda', reference: null }],
  [['phi', 'φ', 'er', 'eq ratio', 'equivalence ratio'], { unit: 'phi', reference: null }],
  [['kph', 'km/h', 'kmh', 'kmph', 'km/hr'], { unit: 'kph', reference: null }],
  [['mph', 'mi/h', 'mi/hr'], { unit: 'mph', reference: null }],
  [['deg', '°', 'degrees', 'degree', '° crank', 'deg crank'], { unit: 'deg', reference: null }],
  [
    ['cl=1', '1=on', '1=cl', '0/1', 'on/off', 'bool', 'flag', '1=cut'],
    { unit: 'flag', reference: null },
  ],
];

const BY_SPELLING: ReadonlyMap<string, UnitReading> = new Map(
  UNIT_SPELLINGS.flatMap(([spellings, reading]) => spellings.map((s) => [s, reading] as const)),
);

/**
 * Unit text in a comparable form: trimmed, lower case, outer brackets removed, a degree sign
 * separated from its letter (`°F` → `° f`) and runs of spaces collapsed.
 */
export function normaliseUnit(text: string): string {
  let t = text.trim().toLowerCase();
  while (/^[[(].*[\])]$/.test(t)) t = t.slice(1, -1).trim();
  return t.replace(/°\s*/g, '° ').replace(/\s+/g, ' ').trim();
}

/**
 * The unit a piece of text names (`kPa`, `psig`, `°F`, `λ`, `km/h`, `CL=1`…), or null when it
 * names none the importer knows.
 */
export function parseUnitText(text: string): UnitReading | null {
  const key = normaliseUnit(text);
  if (key === '') return null;
  return BY_SPELLING.get(key) ?? BY_SPELLING.get(key.replace(/ /g, '')) ?? null;
}

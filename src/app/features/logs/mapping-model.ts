import type { ColumnMappingInput } from '@shared/contracts/logs';
import { CHANNELS, type Channel } from '@shared/core/channels';
import { CHANNEL_UNITS, type ChannelUnit } from '@shared/import/column-mapping';
import { parseUnitText } from '@shared/import/parse-unit-text';
import type { CsvSniff } from '@shared/import/sniff-csv';
import type { MappingSuggestion } from '@shared/import/suggest-mapping';

/**
 * The mapping dialog's state and rules, free of Angular: one choice per CSV column (a channel or
 * "ignore", and a unit that fits the channel), checked for the channels an analysis needs, and
 * turned into the API's mapping shape.
 */

/** Below this confidence a suggested channel is shown for checking, and the dialog opens. */
export const TRUSTED_CONFIDENCE = 0.8;

/** A column's channel, or `ignore` when the column is not read. */
export type ChannelChoice = Channel | 'ignore';

/** What the user chose for one column. */
export interface ColumnChoice {
  /** The channel the column holds, or `ignore`. */
  readonly channel: ChannelChoice;
  /** The column's unit; null when the channel has none (or is ignored). */
  readonly unit: ChannelUnit | null;
}

/** One CSV column as the dialog shows it. */
export interface MappingColumn {
  /** Position in the file, from 0. */
  readonly index: number;
  /** The header text. */
  readonly name: string;
  /** The unit text the file states for it (units row or brackets), or null. */
  readonly statedUnit: string | null;
  /** The suggestion's confidence for this column's channel, or null when nothing was suggested. */
  readonly confidence: number | null;
}

/** Our channel names for people, in the order the picker lists them. */
export const CHANNEL_LABELS: Readonly<Record<Channel, string>> = {
  time: 'Time',
  rpm: 'Engine speed (RPM)',
  map: 'MAP (absolute)',
  boost: 'Boost (gauge)',
  baro: 'Barometer',
  lambda: 'Measured lambda / AFR',
  lambdaTarget: 'Commanded lambda / AFR',
  iat: 'Intake air temperature',
  ect: 'Coolant temperature',
  tps: 'Throttle',
  stft: 'Short-term fuel trim',
  ltft: 'Long-term fuel trim',
  gear: 'Gear',
  speed: 'Road speed',
  closedLoop: 'Closed-loop flag',
  fuelCut: 'Fuel-cut flag',
  knock: 'Knock retard',
  injDuty: 'Injector duty',
};

/** Unit names for people. */
export const UNIT_LABELS: Readonly<Record<ChannelUnit, string>> = {
  s: 's',
  ms: 'ms',
  rpm: 'rpm',
  kPa: 'kPa',
  psi: 'psi',
  bar: 'bar',
  inHg: 'inHg',
  lambda: 'lambda (λ)',
  afr: 'AFR',
  phi: 'equivalence ratio (φ)',
  C: '°C',
  F: '°F',
  K: 'K',
  kph: 'km/h',
  mph: 'mph',
  '%': '%',
  deg: '°',
};

/** The channels the picker offers, in canonical order. */
export const CHANNEL_CHOICES: readonly Channel[] = CHANNELS;

/** The units a channel may be read in; empty when it has none. */
export function unitsFor(channel: ChannelChoice): readonly ChannelUnit[] {
  return channel === 'ignore' ? [] : CHANNEL_UNITS[channel];
}

/**
 * The unit a column gets when `channel` is chosen for it: the unit the file states, when it
 * fits the channel; else the channel's canonical unit; null for channels without a unit.
 */
export function unitForChoice(
  channel: ChannelChoice,
  statedUnit: string | null,
): ChannelUnit | null {
  const units = unitsFor(channel);
  if (units.length === 0) return null;
  const stated = statedUnit === null ? null : parseUnitText(statedUnit);
  const fits = stated !== null && stated.unit !== 'flag' && units.includes(stated.unit);
  return fits ? (stated.unit as ChannelUnit) : (units[0] as ChannelUnit);
}

/** The dialog's columns and their starting choices, from the file's head and the suggestion. */
export function initialMapping(
  sniff: CsvSniff,
  suggestion: MappingSuggestion,
): { columns: MappingColumn[]; choices: ColumnChoice[] } {
  const byIndex = new Map<number, [Channel, number, ChannelUnit | undefined]>();
  for (const [channel, s] of Object.entries(suggestion.channels)) {
    if (s) byIndex.set(s.index, [channel as Channel, s.confidence, s.unit]);
  }
  const columns = sniff.columns.map((column) => ({
    index: column.index,
    name: column.name,
    statedUnit: column.unit,
    confidence: byIndex.get(column.index)?.[1] ?? null,
  }));
  const choices = sniff.columns.map((column): ColumnChoice => {
    const suggested = byIndex.get(column.index);
    if (!suggested) return { channel: 'ignore', unit: null };
    const [channel, , unit] = suggested;
    return { channel, unit: unit ?? unitForChoice(channel, column.unit) };
  });
  return { columns, choices };
}

/**
 * Whether a suggestion can be used without asking: nothing required is missing and every
 * required channel it found is at least {@link TRUSTED_CONFIDENCE} sure.
 */
export function isSuggestionTrusted(suggestion: MappingSuggestion): boolean {
  if (suggestion.missing.length > 0) return false;
  const { channels } = suggestion;
  const pressure: Channel[] = channels.map ? ['map'] : ['boost', 'baro'];
  const required: Channel[] = ['time', 'rpm', ...pressure, 'lambda', 'lambdaTarget'];
  return required.every((channel) => (channels[channel]?.confidence ?? 0) >= TRUSTED_CONFIDENCE);
}

/** How one required channel stands. */
export interface RequiredLine {
  /** What is needed, in words. */
  readonly label: string;
  /** `ok`, `missing` (no column), or `twice` (more than one column). */
  readonly state: 'ok' | 'missing' | 'twice';
  /** The columns chosen for it. */
  readonly columns: readonly string[];
}

/** The columns chosen for each channel. */
function columnsByChannel(
  columns: readonly MappingColumn[],
  choices: readonly ColumnChoice[],
): Map<Channel, string[]> {
  const by = new Map<Channel, string[]>();
  choices.forEach((choice, i) => {
    if (choice.channel === 'ignore') return;
    by.set(choice.channel, [...(by.get(choice.channel) ?? []), columns[i]?.name ?? `#${i}`]);
  });
  return by;
}

function lineFor(label: string, chosen: readonly string[]): RequiredLine {
  const state = chosen.length === 0 ? 'missing' : chosen.length > 1 ? 'twice' : 'ok';
  return { label, state, columns: chosen };
}

/**
 * The channels an analysis needs and how each stands: time, RPM, MAP (or gauge boost with a
 * barometer, since absolute pressure = boost + barometer), measured and commanded mixture.
 */
export function requiredLines(
  columns: readonly MappingColumn[],
  choices: readonly ColumnChoice[],
): RequiredLine[] {
  const by = columnsByChannel(columns, choices);
  const get = (channel: Channel) => by.get(channel) ?? [];
  const pressure: RequiredLine[] =
    get('map').length === 0 && get('boost').length > 0
      ? [lineFor('Boost (gauge)', get('boost')), lineFor('Barometer, for the boost', get('baro'))]
      : [lineFor('MAP (or boost with a barometer)', get('map'))];
  return [
    lineFor('Time', get('time')),
    lineFor('Engine speed (RPM)', get('rpm')),
    ...pressure,
    lineFor('Measured lambda / AFR', get('lambda')),
    lineFor('Commanded lambda / AFR', get('lambdaTarget')),
  ];
}

/**
 * What is wrong with the choices beyond a missing required channel: a channel chosen for more
 * than one column, or a unit that does not fit its channel. In words; empty when nothing is.
 */
export function choiceProblems(
  columns: readonly MappingColumn[],
  choices: readonly ColumnChoice[],
): string[] {
  const problems: string[] = [];
  for (const [channel, chosen] of columnsByChannel(columns, choices)) {
    if (chosen.length > 1) {
      problems.push(
        `${CHANNEL_LABELS[channel]} is chosen for ${chosen.length} columns: ${chosen.join(', ')}.`,
      );
    }
  }
  choices.forEach((choice, i) => {
    const units = unitsFor(choice.channel);
    if (units.length > 0 && (choice.unit === null || !units.includes(choice.unit))) {
      problems.push(`Choose a unit for column ${columns[i]?.name ?? `#${i}`}.`);
    }
  });
  return problems;
}

/** Every reason the choices cannot be sent yet, in words; empty when they can. */
export function mappingProblems(
  columns: readonly MappingColumn[],
  choices: readonly ColumnChoice[],
): string[] {
  const missing = requiredLines(columns, choices)
    .filter((line) => line.state === 'missing')
    .map((line) => `Choose a column for: ${line.label}.`);
  return [...missing, ...choiceProblems(columns, choices)];
}

/** Whether any column is read as AFR (converted with the vehicle's stoichiometric AFR). */
export function usesAfr(choices: readonly ColumnChoice[]): boolean {
  return choices.some(
    (c) => (c.channel === 'lambda' || c.channel === 'lambdaTarget') && c.unit === 'afr',
  );
}

/**
 * The choices as the API's mapping: channels only, so the server detects the layout (delimiter,
 * header row, decimal mark) of each file again and the saved preset fits files whose preamble
 * differs. Units are given only where a channel has a choice of them. Throws when the choices
 * still have problems (see {@link mappingProblems}).
 */
export function toMappingInput(
  columns: readonly MappingColumn[],
  choices: readonly ColumnChoice[],
): ColumnMappingInput {
  const problems = mappingProblems(columns, choices);
  if (problems.length > 0) throw new Error(`toMappingInput: ${problems[0]}`);
  const channels: ColumnMappingInput['channels'] = {};
  choices.forEach((choice, i) => {
    if (choice.channel === 'ignore') return;
    const column = columns[i]?.name as string;
    const hasUnitChoice = unitsFor(choice.channel).length > 1;
    channels[choice.channel] =
      hasUnitChoice && choice.unit !== null ? { column, unit: choice.unit } : { column };
  });
  return { channels };
}

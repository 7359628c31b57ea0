import { sniffCsv } from '@shared/import/sniff-csv';
import { suggestMapping, type MappingSuggestion } from '@shared/import/suggest-mapping';
import {
  choiceProblems,
  initialMapping,
  isSuggestionTrusted,
  mappingProblems,
  requiredLines,
  toMappingInput,
  unitForChoice,
  usesAfr,
  type ColumnChoice,
  type MappingColumn,
} from './mapping-model';

/** A head with invented names: only `engine_rpm` is sure; `manifold_x` is a weak MAP guess. */
const ODD_HEAD = [
  'clock_s,engine_rpm,manifold_x,probe_a,probe_a_aim,pedal_pct',
  '0.00,900,35.2,1.010,1.000,3.0',
  '0.05,905,35.0,1.005,1.000,3.0',
].join('\n');

const sniff = sniffCsv(ODD_HEAD);
const suggestion = suggestMapping(sniff);
const { columns, choices } = initialMapping(sniff, suggestion);

/** `choices` with column `name` changed to `choice`. */
function choose(
  base: readonly ColumnChoice[],
  changes: Record<string, ColumnChoice>,
): ColumnChoice[] {
  return base.map((choice, i) => changes[(columns[i] as MappingColumn).name] ?? choice);
}

/** The odd head mapped by hand, as a user would in the dialog. */
const mapped = choose(choices, {
  clock_s: { channel: 'time', unit: 's' },
  manifold_x: { channel: 'map', unit: 'kPa' },
  probe_a: { channel: 'lambda', unit: 'lambda' },
  probe_a_aim: { channel: 'lambdaTarget', unit: 'lambda' },
  pedal_pct: { channel: 'tps', unit: '%' },
});

describe('mapping model', () => {
  it('When the dialog opens, then each column starts from the suggestion with its confidence', () => {
    expect(columns.map((c) => [c.name, c.confidence])).toEqual([
      ['clock_s', null],
      ['engine_rpm', 0.95],
      ['manifold_x', 0.42],
      ['probe_a', null],
      ['probe_a_aim', null],
      ['pedal_pct', null],
    ]);
    expect(choices.map((c) => c.channel)).toEqual([
      'ignore',
      'rpm',
      'map',
      'ignore',
      'ignore',
      'ignore',
    ]);
    expect(choices[2]).toEqual({ channel: 'map', unit: 'kPa' });
  });

  it.each<[string, Partial<MappingSuggestion>, boolean]>([
    ['the odd head (weak MAP, three missing)', suggestion, false],
    [
      'every required channel at 0.8 or more',
      {
        missing: [],
        channels: {
          time: { column: 't', index: 0, unitSource: 'header', confidence: 1 },
          rpm: { column: 'r', index: 1, unitSource: 'header', confidence: 0.8 },
          map: { column: 'm', index: 2, unitSource: 'header', confidence: 0.9 },
          lambda: { column: 'l', index: 3, unitSource: 'name', confidence: 0.9 },
          lambdaTarget: { column: 'c', index: 4, unitSource: 'name', confidence: 0.85 },
        },
      },
      true,
    ],
    [
      'gauge boost sure but the barometer a guess',
      {
        missing: [],
        channels: {
          time: { column: 't', index: 0, unitSource: 'header', confidence: 1 },
          rpm: { column: 'r', index: 1, unitSource: 'header', confidence: 1 },
          boost: { column: 'b', index: 2, unitSource: 'header', confidence: 1 },
          baro: { column: 'p', index: 3, unitSource: 'values', confidence: 0.6 },
          lambda: { column: 'l', index: 4, unitSource: 'name', confidence: 0.9 },
          lambdaTarget: { column: 'c', index: 5, unitSource: 'name', confidence: 0.9 },
        },
      },
      false,
    ],
  ])('When the suggestion is %s, then trusted is %p', (_name, given, expected) => {
    expect(isSuggestionTrusted({ ...suggestion, ...given } as MappingSuggestion)).toBe(expected);
  });

  it.each<[string, string | null, ReturnType<typeof unitForChoice>]>([
    ['map', 'psi', 'psi'],
    ['map', 'degC', 'kPa'],
    ['map', null, 'kPa'],
    ['lambda', 'AFR', 'afr'],
    ['iat', '°F', 'F'],
    ['rpm', null, 'rpm'],
    ['closedLoop', 'CL=1', null],
    ['ignore', 'psi', null],
  ])('When %s is chosen for a column stating %p, then its unit is %p', (channel, stated, unit) => {
    expect(unitForChoice(channel as ColumnChoice['channel'], stated)).toBe(unit);
  });

  it.each<[string, Record<string, ColumnChoice>, string[]]>([
    ['all mapped', {}, []],
    [
      'time left out',
      { clock_s: { channel: 'ignore', unit: null } },
      ['Choose a column for: Time.'],
    ],
    [
      'RPM chosen twice',
      { pedal_pct: { channel: 'rpm', unit: 'rpm' } },
      ['Engine speed (RPM) is chosen for 2 columns: engine_rpm, pedal_pct.'],
    ],
    [
      'gauge boost without a barometer',
      { manifold_x: { channel: 'boost', unit: 'psi' } },
      ['Choose a column for: Barometer, for the boost.'],
    ],
    [
      'a unit that does not fit',
      { manifold_x: { channel: 'map', unit: 'C' } },
      ['Choose a unit for column manifold_x.'],
    ],
  ])('When %s, then the problems are %p', (_name, changes, problems) => {
    expect(mappingProblems(columns, choose(mapped, changes))).toEqual(problems);
    // The repeats and units alone, for the list under the required channels.
    expect(choiceProblems(columns, choose(mapped, changes))).toEqual(
      problems.filter((p) => !p.startsWith('Choose a column for')),
    );
  });

  it('When boost has a barometer, then both show as required and fine', () => {
    const lines = requiredLines(
      columns,
      choose(mapped, {
        manifold_x: { channel: 'boost', unit: 'psi' },
        pedal_pct: { channel: 'baro', unit: 'kPa' },
      }),
    );
    expect(lines.map((l) => [l.label, l.state])).toEqual([
      ['Time', 'ok'],
      ['Engine speed (RPM)', 'ok'],
      ['Boost (gauge)', 'ok'],
      ['Barometer, for the boost', 'ok'],
      ['Measured lambda / AFR', 'ok'],
      ['Commanded lambda / AFR', 'ok'],
    ]);
  });

  it('When the choices are complete, then the mapping holds channels only, units where they vary', () => {
    expect(toMappingInput(columns, mapped)).toEqual({
      channels: {
        time: { column: 'clock_s', unit: 's' },
        rpm: { column: 'engine_rpm' },
        map: { column: 'manifold_x', unit: 'kPa' },
        lambda: { column: 'probe_a', unit: 'lambda' },
        lambdaTarget: { column: 'probe_a_aim', unit: 'lambda' },
        tps: { column: 'pedal_pct' },
      },
    });
    expect(() => toMappingInput(columns, choices)).toThrow('Choose a column for: Time.');
  });

  it.each<[string, Record<string, ColumnChoice>, boolean]>([
    ['lambda columns', {}, false],
    ['commanded mixture in AFR', { probe_a_aim: { channel: 'lambdaTarget', unit: 'afr' } }, true],
  ])('When the mixture is read as %s, then the AFR note shows: %p', (_name, changes, expected) => {
    expect(usesAfr(choose(mapped, changes))).toBe(expected);
  });
});

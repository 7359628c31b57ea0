import type { Channel } from '../core/channels';
import { csvText, CSV_STYLES, DEMO_VEHICLES, simulateSamples, type CsvStyle } from '../sim';
import { STOICH_AFR } from '../units';
import type { ColumnMapping } from './column-mapping';
import { createLogBuilder } from './log-builder';
import { parseCsvChunks, parseCsvText } from './parse-csv-text';
import {
  describePlausibleRange,
  implausibleMessage,
  isPlausible,
  PLAUSIBLE_RANGES,
  type PlausibleRange,
} from './plausible-ranges';

const OPTIONS = { stoichAfr: STOICH_AFR.gasoline };

// Every channel with a limit, in canonical units: the lowest and highest value kept, and a
// value just beyond each that is dropped. Written out rather than read from the table, so that
// a change of a limit shows here. Sources are beside each limit in plausible-ranges.ts.
const LIMITS: readonly [Channel, number, number, number, number][] = [
  ['rpm', 0, 25_000, -0.5, 25_000.5],
  ['map', 0, 1000, -0.01, 1000.01],
  ['baro', 30, 120, 29.99, 120.01],
  ['lambda', 1e-6, 10, 0, 10.001],
  ['lambdaTarget', 1e-6, 10, 0, 10.001],
  ['iat', -40, 215, -40.01, 215.01],
  ['ect', -40, 215, -40.01, 215.01],
  ['tps', -10, 110, -10.01, 110.01],
  ['stft', -100, 100, -100.01, 100.01],
  ['ltft', -100, 100, -100.01, 100.01],
  ['speed', 0, 500, -0.1, 500.1],
  ['knock', -60, 60, -60.1, 60.1],
  ['injDuty', 0, 200, -0.1, 200.1],
];

function rangeOf(channel: Channel): PlausibleRange {
  const range = PLAUSIBLE_RANGES[channel];
  if (range === undefined) throw new Error(`no range for ${channel}`);
  return range;
}

describe('PLAUSIBLE_RANGES and isPlausible', () => {
  it.each(LIMITS)(
    'When %s sits on its limits (%d, %d), then it is kept; just beyond (%d, %d), then it is not',
    (channel, lowest, highest, below, above) => {
      const range = rangeOf(channel);
      expect([lowest, highest].map((v) => isPlausible(v, range))).toEqual([true, true]);
      expect([below, above].map((v) => isPlausible(v, range))).toEqual([false, false]);
    },
  );

  it('When the table is listed, then exactly the channels checked above have a limit', () => {
    expect(Object.keys(PLAUSIBLE_RANGES).sort()).toEqual(LIMITS.map(([c]) => c).sort());
  });

  it('When a value is missing, huge or infinite, then only the missing one is plausible', () => {
    const rpm = rangeOf('rpm');
    expect(isPlausible(NaN, rpm)).toBe(true);
    expect(isPlausible(99_999_999, rpm)).toBe(false);
    expect(isPlausible(Infinity, rpm)).toBe(false);
    expect(isPlausible(-Infinity, rangeOf('iat'))).toBe(false);
  });

  it('When a converted value lands a rounding error past a limit, then it is still kept', () => {
    // A unit conversion's rounding error is about 1e-16 relative; these stand well beyond it.
    expect(isPlausible(-40 - 1e-12, rangeOf('iat'))).toBe(true);
    expect(isPlausible(25_000 * (1 + 1e-13), rangeOf('rpm'))).toBe(true);
    expect(isPlausible(-40 - 1e-6, rangeOf('iat'))).toBe(false);
  });

  it('When a message is written, then it names the channel, value, range and conversion', () => {
    expect(implausibleMessage('rpm', 99_999_999, rangeOf('rpm'))).toBe(
      'rpm 99999999 is outside the plausible range 0 to 25000 rpm',
    );
    expect(implausibleMessage('iat', 260.123456789123, rangeOf('iat'), 'from °F')).toBe(
      'iat 260.1234568 °C (from °F) is outside the plausible range -40 to 215 °C',
    );
    expect(describePlausibleRange(rangeOf('lambda'))).toBe('above 0, up to 10');
  });
});

/** Every channel with a limit, plus time, as a snake-style file names them. */
const HEADER = [
  't',
  'rpm',
  'map',
  'lam',
  'tgt',
  'baro',
  'iat',
  'ect',
  'tps',
  'stft',
  'ltft',
  'speed',
  'knock',
  'duty',
];
const MAPPING: ColumnMapping = {
  headerRow: 0,
  channels: {
    time: { column: 't' },
    rpm: { column: 'rpm' },
    map: { column: 'map' },
    lambda: { column: 'lam' },
    lambdaTarget: { column: 'tgt' },
    baro: { column: 'baro' },
    iat: { column: 'iat' },
    ect: { column: 'ect' },
    tps: { column: 'tps' },
    stft: { column: 'stft' },
    ltft: { column: 'ltft' },
    speed: { column: 'speed' },
    knock: { column: 'knock' },
    injDuty: { column: 'duty' },
  },
};
/** An ordinary part-load row, time aside. */
const GOOD = ['2500', '65', '0.98', '1', '101.3', '30', '88', '22', '1.5', '-2.3', '60', '0', '18'];

/** Data row `i` (time i/10 s) with the cells of `changes` (column → text) replaced. */
function row(i: number, changes: Record<string, string> = {}): string[] {
  const cells = [String(i / 10), ...GOOD];
  for (const [column, text] of Object.entries(changes)) cells[HEADER.indexOf(column)] = text;
  return cells;
}

function csv(rows: readonly (readonly string[])[]): string {
  return [HEADER, ...rows].map((r) => r.join(',')).join('\n') + '\n';
}

describe('createLogBuilder plausibility', () => {
  it('When rpm is 99 999 999 and MAP 1e30, then both rows are dropped and reported by row and column', () => {
    const text = csv([
      row(0),
      row(1, { rpm: '99999999' }),
      row(2),
      row(3, { map: '1e30' }),
      row(4),
    ]);
    const { log, problems, stats } = parseCsvText(text, MAPPING, OPTIONS);
    expect(Array.from(log.channels.time ?? [])).toEqual([0, 0.2, 0.4]);
    expect(Math.max(...(log.channels.map ?? []))).toBe(65);
    // Lines count from 0 with the header on line 0: data row i is line i + 1.
    expect(problems).toEqual([
      {
        row: 2,
        column: 'rpm',
        channel: 'rpm',
        message: 'rpm 99999999 is outside the plausible range 0 to 25000 rpm',
      },
      {
        row: 4,
        column: 'map',
        channel: 'map',
        message: 'map 1e+30 is outside the plausible range 0 to 1000 kPa',
      },
    ]);
    expect(stats).toEqual({
      rowsRead: 5,
      rowsKept: 3,
      rowsDroppedUnreadable: 0,
      rowsDroppedTimeBack: 0,
      rowsDroppedImplausible: 2,
      blankRows: 0,
      problemCount: 2,
      droppedFraction: 0.4,
      isMostlyBad: false,
    });
  });

  // One row per channel just past a limit: required and optional channels alike drop the row.
  const BREAKS: readonly [string, string, string][] = [
    ['rpm', '-1', 'rpm -1 is outside the plausible range 0 to 25000 rpm'],
    ['rpm', '25001', 'rpm 25001 is outside the plausible range 0 to 25000 rpm'],
    ['map', '-5', 'map -5 is outside the plausible range 0 to 1000 kPa'],
    ['map', '1000.5', 'map 1000.5 is outside the plausible range 0 to 1000 kPa'],
    ['lam', '0', 'lambda 0 is outside the plausible range above 0, up to 10'],
    ['lam', '10.5', 'lambda 10.5 is outside the plausible range above 0, up to 10'],
    ['tgt', '-0.8', 'lambdaTarget -0.8 is outside the plausible range above 0, up to 10'],
    ['baro', '12', 'baro 12 is outside the plausible range 30 to 120 kPa'],
    ['iat', '-41', 'iat -41 is outside the plausible range -40 to 215 °C'],
    ['ect', '216', 'ect 216 is outside the plausible range -40 to 215 °C'],
    ['tps', '150', 'tps 150 is outside the plausible range -10 to 110 %'],
    ['stft', '-101', 'stft -101 is outside the plausible range -100 to 100 %'],
    ['ltft', '250', 'ltft 250 is outside the plausible range -100 to 100 %'],
    ['speed', '65535', 'speed 65535 is outside the plausible range 0 to 500 km/h'],
    ['knock', '-99', 'knock -99 is outside the plausible range -60 to 60 °'],
    ['duty', '201', 'injDuty 201 is outside the plausible range 0 to 200 %'],
  ];

  it.each(BREAKS)(
    'When column %s holds %s, then that row is dropped and reported',
    (column, cell, message) => {
      const text = csv([row(0), row(1, { [column]: cell }), row(2)]);
      const { log, problems, stats } = parseCsvText(text, MAPPING, OPTIONS);
      expect(Array.from(log.channels.time ?? [])).toEqual([0, 0.2]);
      const channel = Object.entries(MAPPING.channels).find(([, m]) => m?.column === column)?.[0];
      expect(problems).toEqual([{ row: 2, column, channel, message }]);
      expect(stats).toMatchObject({ rowsKept: 2, rowsDroppedImplausible: 1, problemCount: 1 });
    },
  );

  it('When every value sits on a limit, then no row is dropped', () => {
    const text = csv([
      row(0, { rpm: '0', map: '0', lam: '10', tgt: '10', baro: '30', iat: '-40', ect: '215' }),
      row(1, { rpm: '25000', map: '1000', baro: '120', tps: '-10', stft: '-100', ltft: '100' }),
      row(2, { tps: '110', speed: '0', knock: '-60', duty: '0', iat: '215', ect: '-40' }),
      row(3, { speed: '500', knock: '60', duty: '200', lam: '0.001', tgt: '0.001' }),
    ]);
    const { log, problems, stats } = parseCsvText(text, MAPPING, OPTIONS);
    expect(problems).toEqual([]);
    expect(log.length).toBe(4);
    expect(stats.rowsDroppedImplausible).toBe(0);
  });

  it('When the rows come as bytes, split lines or parsed rows, then the same rows are dropped', () => {
    const text = csv([
      row(0),
      row(1, { rpm: '99999999', knock: '360' }),
      row(2, { lam: '0' }),
      row(3),
    ]);
    const whole = parseCsvText(text, MAPPING, OPTIONS);
    // parseCsvChunks hands quote-free text to the byte scanner; cut mid-line on purpose.
    const scanned = parseCsvChunks([text.slice(0, 70), text.slice(70)], MAPPING, OPTIONS);
    // A non-ASCII character in the data sends the lines through the split path instead.
    const odd = row(5, { duty: '18 µ' }).join(',') + '\n';
    const split = parseCsvChunks([text + odd], MAPPING, OPTIONS);
    expect(whole.stats.rowsDroppedImplausible).toBe(2);
    expect(whole.problems.map((p) => [p.row, p.column])).toEqual([
      [2, 'rpm'],
      [2, 'knock'],
      [3, 'lam'],
    ]);
    expect(scanned.problems).toEqual(whole.problems);
    expect(scanned.stats).toEqual(whole.stats);
    expect(split.problems.slice(0, 3)).toEqual(whole.problems);
    expect(split.problems[3]).toMatchObject({ row: 5, column: 'duty' });
    expect(split.stats).toMatchObject({ rowsRead: 5, rowsKept: 3, rowsDroppedImplausible: 2 });
  });

  it('When a column is in another unit, then the limit applies to the converted value', () => {
    const mapping: ColumnMapping = {
      headerRow: 0,
      channels: {
        ...MAPPING.channels,
        iat: { column: 'iat', unit: 'F' },
        lambda: { column: 'lam', unit: 'afr' },
        speed: { column: 'speed', unit: 'mph' },
      },
    };
    const text = csv([
      // −40 °F is −40 °C; AFR 147 is λ 10 on 14.7 (reference.md §3 [P]); 310 mph is 498.9 km/h.
      row(0, { iat: '-40', lam: '147', speed: '310' }),
      // computed from the formulas (reference.md §4) [C]: 420 °F = 215.56 °C; 311 mph = 500.51
      // km/h (statute mile = 1609.344 m exactly, by definition).
      row(1, { iat: '420' }),
      row(2, { speed: '311' }),
      row(3, { lam: '0' }),
    ]);
    const { log, problems } = parseCsvText(text, mapping, OPTIONS);
    expect(log.length).toBe(1);
    expect(problems.map((p) => [p.row, p.column, p.message])).toEqual([
      [
        2,
        'iat',
        'iat 215.5555556 °C (after unit conversion) is outside the plausible range -40 to 215 °C',
      ],
      [
        3,
        'speed',
        'speed 500.505984 km/h (after unit conversion) is outside the plausible range 0 to 500 km/h',
      ],
      [
        4,
        'lam',
        'lambda 0 (after unit conversion) is outside the plausible range above 0, up to 10',
      ],
    ]);
  });

  it('When gauge boost plus the barometer passes the MAP limit, then the row is dropped at the boost column', () => {
    const { map: _map, ...others } = MAPPING.channels;
    const mapping: ColumnMapping = {
      headerRow: 0,
      channels: { ...others, boost: { column: 'map', unit: 'psi' } },
    };
    // computed from the formulas (reference.md §4) [C]: 130 psi = 896.32 kPa, + 101.3 = 997.6
    // kPa absolute (kept); 131 psi = 903.21 kPa, + 101.3 = 1004.5 kPa (dropped).
    const text = csv([row(0, { map: '130' }), row(1, { map: '131' }), row(2, { map: '-14' })]);
    const { log, problems, stats } = parseCsvText(text, mapping, OPTIONS);
    expect(log.length).toBe(2);
    expect(log.channels.map?.[0]).toBeCloseTo(997.6184, 3);
    expect(problems).toEqual([
      {
        row: 2,
        column: 'map',
        channel: 'boost',
        message:
          'map 1004.513205 kPa (boost + barometer) is outside the plausible range 0 to 1000 kPa',
      },
    ]);
    expect(stats.rowsDroppedImplausible).toBe(1);
  });

  it('When a row is both unreadable and implausible, then both cells are reported and it counts once, as unreadable', () => {
    const text = csv([row(0), row(1, { rpm: 'n/a', map: '1e30' }), row(2)]);
    const { problems, stats } = parseCsvText(text, MAPPING, OPTIONS);
    expect(problems.map((p) => [p.row, p.column])).toEqual([
      [2, 'rpm'],
      [2, 'map'],
    ]);
    expect(stats).toMatchObject({
      rowsKept: 2,
      rowsDroppedUnreadable: 1,
      rowsDroppedImplausible: 0,
      problemCount: 2,
    });
  });

  it('When an implausible row sits between two others, then it does not move the time-order check', () => {
    // Row 1 is dropped before its time is taken, so row 2 (0.15 s) is compared with row 0.
    const rows = [row(0), row(1, { rpm: '1e9' }), row(1.5), row(3)];
    const { log, stats } = parseCsvText(csv(rows), MAPPING, OPTIONS);
    expect(Array.from(log.channels.time ?? [])).toEqual([0, 0.15, 0.3]);
    expect(stats).toMatchObject({ rowsDroppedImplausible: 1, rowsDroppedTimeBack: 0 });
  });

  it('When most rows are implausible, then the file is flagged mostly bad', () => {
    const rows = Array.from({ length: 10 }, (_, i) => row(i, i < 4 ? {} : { map: '5000' }));
    const { stats } = parseCsvText(csv(rows), MAPPING, { ...OPTIONS, mostlyBadFraction: 0.5 });
    expect(stats).toMatchObject({
      rowsKept: 4,
      rowsDroppedImplausible: 6,
      droppedFraction: 0.6,
      isMostlyBad: true,
    });
    const fewer = Array.from({ length: 10 }, (_, i) => row(i, i < 5 ? {} : { map: '5000' }));
    expect(parseCsvText(csv(fewer), MAPPING, OPTIONS).stats.isMostlyBad).toBe(false);
  });

  it('When every row is implausible, then finish throws no_usable_rows at the first one', () => {
    const builder = createLogBuilder(MAPPING, OPTIONS);
    builder.pushRows(
      [HEADER, row(0, { lam: '0' }), row(1, { rpm: 'x' }), row(2, { rpm: '-3' })],
      0,
    );
    expect(() => builder.finish()).toThrow(
      expect.objectContaining({
        code: 'no_usable_rows',
        message: 'none of the 3 rows could be used (1 unreadable, 2 with implausible values)',
        details: { row: 1, column: 'lam' },
      }),
    );
  });
});

describe('plausibility on simulated logs', () => {
  // Each demo vehicle on the road (cold start, fuel cuts with the wideband pinned lean) and on
  // the dyno (boost up to about 195 kPa on the turbocharged ones), the CSV styles taken in turn
  // so each (units converted or not) comes twice.
  const cases = DEMO_VEHICLES.flatMap((vehicle, v) =>
    (['road', 'dyno'] as const).map((kind, k) => {
      const style = CSV_STYLES[(2 * v + k) % CSV_STYLES.length] as CsvStyle;
      return [vehicle.label, kind, style, vehicle] as const;
    }),
  );

  it.each(cases)(
    'When %s’s %s log in the %s style is imported, then no row is dropped',
    (_label, kind, style, vehicle) => {
      const samples = simulateSamples({ vehicle, kind, seed: 7, durationS: 300 });
      const { stats, problems } = parseCsvText(csvText(samples, style), undefined, OPTIONS);
      expect(problems).toEqual([]);
      expect(stats.rowsRead).toBeGreaterThan(5000);
      expect(stats.rowsKept).toBe(stats.rowsRead);
      expect(stats.rowsDroppedImplausible).toBe(0);
    },
  );
});

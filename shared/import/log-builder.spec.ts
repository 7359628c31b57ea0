import fc from 'fast-check';
import { STOICH_AFR } from '../units';
import type { ColumnMapping } from './column-mapping';
import { ImportError } from './import-error';
import { createLogBuilder } from './log-builder';

const HEADER = ['t', 'rpm', 'map', 'lam', 'tgt', 'iat', 'cl'];
const MAPPING: ColumnMapping = {
  headerRow: 0,
  channels: {
    time: { column: 't' },
    rpm: { column: 'rpm' },
    map: { column: 'map' },
    lambda: { column: 'lam' },
    lambdaTarget: { column: 'tgt' },
    iat: { column: 'iat' },
    closedLoop: { column: 'cl' },
  },
};
const OPTIONS = { stoichAfr: STOICH_AFR.gasoline };

function build(rows: string[][], mapping = MAPPING, options = {}) {
  const builder = createLogBuilder(mapping, { ...OPTIONS, ...options });
  builder.pushRows([HEADER, ...rows], 0);
  return builder.finish();
}

describe('createLogBuilder conversions', () => {
  // Each case: one column in a non-canonical unit, the cell, and the canonical value expected.
  it.each([
    // computed from the formulas (reference.md §4) [C]: 10 psi × 6.894757293 + 101.325
    [
      'boost psi + baro kPa',
      { map: undefined, boost: { column: 'b', unit: 'psi' }, baro: { column: 'p' } },
      ['10', '101.325'],
      'map',
      170.273,
      3,
    ],
    // computed from the formulas (reference.md §4) [C]: (77 − 32) / 1.8
    ['°F', { iat: { column: 'b', unit: 'F' } }, ['77', ''], 'iat', 25, 12],
    // computed from the formulas (reference.md §4) [C]: 300 − 273.15
    ['kelvin', { iat: { column: 'b', unit: 'K' } }, ['300', ''], 'iat', 26.85, 12],
    // common practice, no published source: gasoline at the trade value 14.7 → λ = 14.7 / 14.7
    ['AFR', { lambda: { column: 'b', unit: 'afr' } }, ['14.7', ''], 'lambda', 1, 12],
    // from memory of Heywood, ICE Fundamentals §3.3 (φ = 1/λ) [S*]
    ['φ', { lambdaTarget: { column: 'b', unit: 'phi' } }, ['1.25', ''], 'lambdaTarget', 0.8, 12],
    // computed from the formulas (reference.md §4) [C]: 2 bar = 200 kPa
    ['bar', { map: { column: 'b', unit: 'bar' } }, ['2', ''], 'map', 200, 12],
    // conventional inch of mercury 3386.389 Pa (from memory of NIST SP 811) [S*]
    ['inHg', { map: { column: 'b', unit: 'inHg' } }, ['30', ''], 'map', 101.59167, 5],
    ['ms', { time: { column: 'b', unit: 'ms' } }, ['1500', ''], 'time', 1.5, 12],
    // statute mile = 1609.344 m exactly (definition) [C]
    ['mph', { speed: { column: 'b', unit: 'mph' } }, ['60', ''], 'speed', 96.56064, 9],
  ] as const)(
    'When a column is in %s, then it is stored in the canonical unit',
    (_n, extra, cells, channel, expected, digits) => {
      const mapping: ColumnMapping = { headerRow: 0, channels: { ...MAPPING.channels, ...extra } };
      const builder = createLogBuilder(mapping, OPTIONS);
      builder.pushRows(
        [
          [...HEADER, 'b', 'p'],
          ['0', '900', '40', '1', '1', '20', '1', ...cells],
        ],
        0,
      );
      const { log } = builder.finish();
      expect(log.channels[channel]?.[0]).toBeCloseTo(expected, digits);
    },
  );

  it('When gauge boost has no baro column, then options.baroKpa is added and no boost channel is kept', () => {
    const mapping: ColumnMapping = {
      headerRow: 0,
      channels: { ...MAPPING.channels, map: undefined, boost: { column: 'map', unit: 'kPa' } },
    };
    const { log } = build([['0', '900', '-60', '1', '1', '20', '1']], mapping, { baroKpa: 100 });
    expect(log.channels.map?.[0]).toBeCloseTo(40, 12);
    expect(log.channels.boost).toBeUndefined();
  });

  it('When flags are words, then on/off and true/false read as 1/0', () => {
    const { log } = build([
      ['0', '900', '40', '1', '1', '20', 'on'],
      ['1', '900', '40', '1', '1', '20', 'FALSE'],
    ]);
    expect(Array.from(log.channels.closedLoop ?? [])).toEqual([1, 0]);
  });
});

describe('createLogBuilder problems', () => {
  it('When a required cell is garbage, then the row is dropped and its line and column reported', () => {
    const result = build([
      ['0', '900', '40', '1', '1', '20', '1'],
      ['1', 'n/a', '40', '1', '1', '20', '1'],
      ['2', '910', '41', '1', '1', '20', '1'],
    ]);
    expect(result.log.length).toBe(2);
    expect(Array.from(result.log.channels.time ?? [])).toEqual([0, 2]);
    expect(result.problems).toEqual([
      { row: 2, column: 'rpm', channel: 'rpm', message: 'not a number: "n/a"' },
    ]);
    expect(result.stats).toMatchObject({ rowsRead: 3, rowsKept: 2, rowsDroppedUnreadable: 1 });
  });

  it('When an optional cell is garbage or empty, then it becomes NaN and only garbage is reported', () => {
    const result = build([
      ['0', '900', '40', '1', '1', 'hot', '1'],
      ['1', '900', '40', '1', '1', '', '7'],
    ]);
    expect(result.log.length).toBe(2);
    expect(Array.from(result.log.channels.iat ?? [])).toEqual([NaN, NaN]);
    expect(result.problems.map((p) => [p.row, p.column, p.message])).toEqual([
      [1, 'iat', 'not a number: "hot"'],
      [2, 'cl', 'flag is 7, not 0 or 1'],
    ]);
  });

  it('When time goes back, then that row is dropped and reported; the start time is kept as is', () => {
    const result = build([
      ['100', '900', '40', '1', '1', '20', '1'],
      ['101', '900', '40', '1', '1', '20', '1'],
      ['100.5', '900', '40', '1', '1', '20', '1'],
      ['101', '900', '40', '1', '1', '20', '1'],
    ]);
    expect(Array.from(result.log.channels.time ?? [])).toEqual([100, 101, 101]);
    expect(result.problems).toEqual([
      { row: 3, column: 't', channel: 'time', message: 'time goes back from 101 s to 100.5 s' },
    ]);
    expect(result.stats.rowsDroppedTimeBack).toBe(1);
  });

  it('When most rows are bad, then the file is flagged and problems beyond maxProblems are only counted', () => {
    const rows = Array.from({ length: 10 }, (_, i) => [
      String(i),
      i < 3 ? '900' : '?',
      '40',
      '1',
      '1',
      '20',
      '1',
    ]);
    const result = build(rows, MAPPING, { maxProblems: 2 });
    expect(result.stats).toMatchObject({
      rowsKept: 3,
      problemCount: 7,
      droppedFraction: 0.7,
      isMostlyBad: true,
    });
    expect(result.problems).toHaveLength(2);
    expect(build(rows.slice(0, 4)).stats.isMostlyBad).toBe(false);
  });

  it('When blank lines sit among the data, then they are skipped and counted', () => {
    const result = build([
      ['0', '900', '40', '1', '1', '20', '1'],
      [''],
      ['1', '900', '40', '1', '1', '20', '1'],
    ]);
    expect(result.stats).toMatchObject({ rowsRead: 2, blankRows: 1 });
    expect(result.problems).toEqual([]);
  });

  it.each([
    ['no rows at all', [], 'no_data'],
    ['only bad rows', [['x', 'y', 'z', '', '', '', '']], 'no_usable_rows'],
  ])('When the file has %s, then finish throws %s', (_n, rows, code) => {
    const builder = createLogBuilder(MAPPING, OPTIONS);
    builder.pushRows([HEADER, ...rows], 0);
    expect(() => builder.finish()).toThrow(expect.objectContaining({ code }));
  });

  it('When a required channel is not mapped, then an ImportError lists what is missing', () => {
    const mapping: ColumnMapping = {
      headerRow: 0,
      channels: { time: { column: 't' }, boost: { column: 'map' } },
    };
    expect(() => createLogBuilder(mapping, OPTIONS)).toThrow(ImportError);
    expect(() => createLogBuilder(mapping, OPTIONS)).toThrow(
      expect.objectContaining({
        code: 'missing_channels',
        details: { missing: ['rpm', 'baro', 'lambda', 'lambdaTarget'] },
      }),
    );
  });

  it('When a mapped column is not in the header, then an ImportError names it', () => {
    const builder = createLogBuilder(MAPPING, OPTIONS);
    expect(() => builder.pushRows([['t', 'rpm', 'MAP2', 'lam', 'tgt', 'iat', 'cl']], 0)).toThrow(
      expect.objectContaining({ code: 'unknown_column', details: { missing: ['map'], row: 0 } }),
    );
  });

  it.each([
    [{ stoichAfr: 0 }, /stoichAfr/],
    [{ stoichAfr: 14.7, baroKpa: -3 }, /baroKpa/],
    [{ stoichAfr: 14.7, maxProblems: 1.5 }, /maxProblems/],
  ])('When options are %j, then the error names the option', (options, message) => {
    expect(() => createLogBuilder(MAPPING, options)).toThrow(message);
  });

  it('When a unit does not fit its channel, then the mapping error names the field', () => {
    const mapping = {
      ...MAPPING,
      channels: { ...MAPPING.channels, iat: { column: 'iat', unit: 'psi' as const } },
    };
    expect(() => createLogBuilder(mapping, OPTIONS)).toThrow(/channels\.iat\.unit/);
  });
});

describe('createLogBuilder chunking', () => {
  const cell = fc.oneof(
    { weight: 8, arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }).map(String) },
    { weight: 1, arbitrary: fc.constantFrom('', 'x', ' 12 ', '1e3', 'on') },
  );
  const row = fc.array(cell, { minLength: 5, maxLength: 8 });

  it('When the same rows are pushed in chunks of any size, then the result is identical', () => {
    fc.assert(
      fc.property(
        fc.array(row, { minLength: 1, maxLength: 60 }),
        fc.array(fc.integer({ min: 1, max: 7 })),
        (rows, cuts) => {
          // Time ascends except where the property draws garbage, so some rows survive.
          const data = rows.map((r, i) => [String(i), ...r.slice(1)]);
          const whole = createLogBuilder(MAPPING, OPTIONS);
          whole.pushRows([HEADER, ...data], 0);
          const chunked = createLogBuilder(MAPPING, OPTIONS);
          const all = [HEADER, ...data];
          let at = 0;
          for (let k = 0; at < all.length; k++) {
            const size = cuts.length > 0 ? (cuts[k % cuts.length] as number) : all.length;
            chunked.pushRows(all.slice(at, at + size), at);
            at += size;
          }
          const outcome = (b: typeof whole) => {
            try {
              return b.finish();
            } catch (error) {
              return (error as ImportError).code;
            }
          };
          expect(outcome(chunked)).toEqual(outcome(whole));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('When 200 000 rows arrive in chunks, then every sample lands in the typed arrays', () => {
    const builder = createLogBuilder(MAPPING, { ...OPTIONS, columns: HEADER });
    const chunk = 10_000;
    for (let start = 0; start < 200_000; start += chunk) {
      const rows = Array.from({ length: chunk }, (_, i) => {
        const t = start + i;
        return [String(t / 100), String(800 + (t % 5000)), '40', '1', '1', '20', '1'];
      });
      builder.pushRows(rows, start + 1);
    }
    const { log, stats } = builder.finish();
    expect(log.length).toBe(200_000);
    expect(log.channels.rpm?.[199_999]).toBe(800 + (199_999 % 5000));
    expect(log.channels.time).toBeInstanceOf(Float64Array);
    expect(log.channels.time?.buffer.byteLength).toBe(200_000 * 8);
    expect(stats.problemCount).toBe(0);
  });
});

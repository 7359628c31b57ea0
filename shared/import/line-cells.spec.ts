import fc from 'fast-check';
import { STOICH_AFR } from '../units';
import type { ColumnMapping, DecimalMark, Delimiter, Newline } from './column-mapping';
import type { ImportError } from './import-error';
import { encodeAscii, LineCells } from './line-cells';
import { createLogBuilder, type LogBuilder } from './log-builder';
import { parseDecimal } from './parse-decimal';

const OPTIONS = { stoichAfr: STOICH_AFR.gasoline };
const HEADER = ['t', 'rpm', 'map', 'lam', 'tgt', 'iat', 'cl', 'note'];

function mappingFor(delimiter: Delimiter, decimal: DecimalMark): ColumnMapping {
  return {
    headerRow: 0,
    unitsRow: 1,
    delimiter,
    decimal,
    channels: {
      time: { column: 't', unit: 'ms' },
      rpm: { column: 'rpm' },
      map: { column: 'map', unit: 'psi' },
      lambda: { column: 'lam', unit: 'afr' },
      lambdaTarget: { column: 'tgt' },
      iat: { column: 'iat', unit: 'F' },
      closedLoop: { column: 'cl' },
    },
  };
}

/** Whether a row's cells are all blank (kept blank by the property: no time put in). */
function isBlank(cells: readonly string[]): boolean {
  return cells.every((cell) => cell.trim() === '');
}

/** The builder's result, or the code of the ImportError it ends with. */
function outcome(builder: LogBuilder): unknown {
  try {
    return builder.finish();
  } catch (error) {
    return (error as ImportError).code;
  }
}

describe('LineCells', () => {
  it('When a cell is any decimal text, then its value is parseDecimal’s or NaN for a fallback', () => {
    const cell = fc.oneof(
      fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
      fc.stringMatching(/^[+-]?\d{0,18}(\.\d{0,18})?$/),
      fc.constantFrom('', '-', '+', '.', '1.2.3', ' 1', '1 ', '1e3', '0x1f', '−1'),
    );
    fc.assert(
      fc.property(fc.array(cell, { minLength: 1, maxLength: 6 }), (cells) => {
        const line = cells.join(';');
        const values = new Float64Array(cells.length);
        const slots = Int32Array.from(cells, (_, k) => k);
        const scanner = new LineCells(slots, values, ';', '.', '\n');
        const bytes = encodeAscii(line, new Uint8Array(line.length));
        if (bytes === null) return; // not ASCII: the builder splits such text instead
        expect(scanner.scan(bytes, 0, bytes.length)).toBe(line.length);
        cells.forEach((text, k) => {
          // NaN tells the builder to read the cell's text itself.
          if (!Number.isNaN(values[k])) expect(values[k]).toBe(parseDecimal(text));
          expect(line.slice(scanner.starts[k], scanner.ends[k])).toBe(text);
        });
      }),
      { numRuns: 300 },
    );
  });
});

describe('LogBuilder.pushUnquotedLines', () => {
  const cell = fc.oneof(
    { weight: 6, arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }).map(String) },
    { weight: 2, arbitrary: fc.integer({ min: 0, max: 2 }).map(String) },
    {
      weight: 2,
      arbitrary: fc.constantFrom('', ' ', 'x', ' 12 ', '1e3', 'on', '-', '1.5.2', '+7', '°', '\t'),
    },
  );
  const line = fc.oneof(
    { weight: 8, arbitrary: fc.array(cell, { minLength: 0, maxLength: 10 }) },
    { weight: 1, arbitrary: fc.constantFrom([''], [' ', ''], ['\t', ' '], ['\u00a0'], ['\v']) },
  );
  const layout = fc.record({
    delimiter: fc.constantFrom<Delimiter>(',', ';', '\t', '|'),
    decimal: fc.constantFrom<DecimalMark>('.', ','),
    newline: fc.constantFrom<Newline>('\n', '\r\n', '\r'),
  });

  it('When lines are pushed as text, then the result equals pushRows of the split lines', () => {
    fc.assert(
      fc.property(
        layout,
        fc.array(line, { minLength: 1, maxLength: 40 }),
        fc.array(fc.integer({ min: 1, max: 9 }), { minLength: 1 }),
        ({ delimiter, decimal: drawn, newline }, cells, cuts) => {
          const decimal = delimiter === ',' ? '.' : drawn;
          // Mostly ascending times with the decimal mark of the layout, so most rows are kept.
          const lines = [
            HEADER,
            ['ms', 'rpm'],
            ...cells.map((c, i) => (isBlank(c) ? c : [String(i), ...c.slice(1)])),
          ]
            .map((c) => c.map((v) => (decimal === ',' ? v.replace('.', ',') : v)))
            .map((c) => c.join(delimiter));
          const mapping = mappingFor(delimiter, decimal);
          const rows = createLogBuilder(mapping, OPTIONS);
          rows.pushRows(
            lines.map((l) => l.split(delimiter)),
            0,
          );
          const text = createLogBuilder(mapping, OPTIONS);
          let at = 0;
          for (let k = 0; at < lines.length; k++) {
            const size = cuts[k % cuts.length] as number;
            const pushed = text.pushUnquotedLines(
              lines.slice(at, at + size).join(newline),
              newline,
              at,
            );
            expect(pushed).toBe(Math.min(size, lines.length - at));
            at += size;
          }
          expect(outcome(text)).toEqual(outcome(rows));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('When two channels read one column, then the text import still equals the row import', () => {
    const mapping: ColumnMapping = {
      headerRow: 0,
      channels: {
        time: { column: 't' },
        rpm: { column: 'rpm' },
        map: { column: 'rpm' },
        lambda: { column: 'lam' },
        lambdaTarget: { column: 'lam' },
      },
    };
    const lines = ['t,rpm,lam', '0,900,1', '1,x,0.9', '2,910,'];
    const rows = createLogBuilder(mapping, OPTIONS);
    rows.pushRows(
      lines.map((l) => l.split(',')),
      0,
    );
    const text = createLogBuilder(mapping, OPTIONS);
    text.pushUnquotedLines(lines.join('\n'), '\n', 0);
    expect(outcome(text)).toEqual(outcome(rows));
  });

  it('When the newline is not a line break, then the error names it', () => {
    const builder = createLogBuilder(mappingFor(',', '.'), OPTIONS);
    expect(() => builder.pushUnquotedLines('a', ';' as Newline, 0)).toThrow(/newline/);
  });
});

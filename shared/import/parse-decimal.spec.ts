import fc from 'fast-check';
import { looksNumeric, parseDecimal } from './parse-decimal';

describe('parseDecimal', () => {
  it.each([
    ['1.5', '.', 1.5],
    ['1,5', ',', 1.5],
    [' -0,25 ', ',', -0.25],
    ['1e3', '.', 1000],
    ['.5', '.', 0.5],
    ['12', ',', 12],
    ['1,5', '.', NaN],
    ['', '.', NaN],
    ['0x1A', '.', NaN],
    ['Infinity', '.', NaN],
    ['12 kPa', '.', NaN],
    ['-', '.', NaN],
    ['.', '.', NaN],
    ['+-5', '.', NaN],
    ['1 2', '.', NaN],
    ['0b1', '.', NaN],
    ['0o7', '.', NaN],
    ['1e999', '.', NaN],
  ] as const)(
    'When the cell is "%s" with decimal "%s", then the number is %s',
    (text, decimal, expected) => {
      expect(parseDecimal(text, decimal)).toBe(expected);
    },
  );

  it.each([
    ['3,25', true],
    ['3.25', true],
    ['kPa', false],
    ['', false],
  ])('looksNumeric("%s") is %s', (text, expected) => {
    expect(looksNumeric(text)).toBe(expected);
  });

  it('When any text is parsed, then the fast path agrees with the plain-number grammar', () => {
    // The slow, obvious definition: trim, match the grammar, then Number().
    const reference = (t: string): number => {
      const x = t.trim();
      return /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(x) && Number.isFinite(Number(x))
        ? Number(x)
        : NaN;
    };
    const numberish = fc.stringMatching(/^[ +\-0-9.eExob]{0,8}$/);
    fc.assert(
      fc.property(fc.oneof(numberish, fc.string(), fc.double().map(String)), (text) => {
        expect(parseDecimal(text, '.')).toBe(reference(text));
      }),
      { numRuns: 2000 },
    );
  });

  it('When a number is written with a decimal comma, then it reads as with a dot', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.integer({ min: 0, max: 6 }),
        (x, digits) => {
          const dotted = x.toFixed(digits);
          expect(parseDecimal(dotted.replace('.', ','), ',')).toBe(Number(dotted));
        },
      ),
    );
  });
});

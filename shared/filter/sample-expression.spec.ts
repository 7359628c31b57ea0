import { type ColumnarLog } from '../core/channels';
import {
  compileSampleExpression,
  evaluateSampleExpression,
  SampleExpressionError,
} from './sample-expression';

const log: ColumnarLog = {
  length: 4,
  channels: {
    time: Float64Array.from([0, 0.1, 0.2, 0.3]),
    rpm: Float64Array.from([1000, 2500, 3500, NaN]),
    tps: Float64Array.from([5, 40, 95, 40]),
    stft: Float64Array.from([-8, 2, -3, 0]),
  },
};
const present = ['time', 'rpm', 'tps', 'stft'] as const;

/** The 0/1 result of an expression over the test log, as a plain array. */
function run(source: string, where?: Uint8Array): number[] {
  return Array.from(evaluateSampleExpression(compileSampleExpression(source, present), log, where));
}

describe('compileSampleExpression accepts channel conditions', () => {
  it.each<[string, number[]]>([
    ['rpm > 1500 and tps < 90', [0, 1, 0, 0]],
    ['abs(stft) < 5', [0, 1, 1, 1]],
    ['min(rpm, 3000) == 3000', [0, 0, 1, 0]],
    // NaN compares false, so `not` of a comparison with NaN holds (sample 3).
    ['max(tps, 50) > 50 or not (rpm < 2000)', [0, 1, 1, 1]],
    ['2000 < rpm < 4000', [0, 1, 1, 0]],
    ['tps > 30 ? rpm > 3000 : true', [1, 0, 1, 0]],
    ['rpm - 1000', [0, 1, 1, 0]], // a number: non-zero holds, NaN does not
    ['(rpm / 1000) ^ 2 * 2 >= 12.5 xor false', [0, 1, 1, 0]],
    ['tps mod 2 == 1', [1, 0, 1, 0]],
  ])('When given "%s", then it holds where expected', (source, expected) => {
    expect(run(source)).toEqual(expected);
  });

  it('When a mask is given, then only masked samples are evaluated (the rest read 0)', () => {
    expect(run('tps > 0', Uint8Array.from([1, 0, 1, 0]))).toEqual([1, 0, 1, 0]);
  });

  it('When compiled, then it lists the channels it reads', () => {
    expect(compileSampleExpression('abs(stft) < 5 and rpm > tps', present).channels).toEqual([
      'stft',
      'rpm',
      'tps',
    ]);
  });
});

describe('compileSampleExpression refuses everything else', () => {
  it.each<[string, RegExp]>([
    ['import({}, {override: true})', /function "import" is not allowed/],
    ['evaluate("1+1")', /function "evaluate" is not allowed/],
    ['parse("x")', /function "parse" is not allowed/],
    ['rpm = 3000', /assignment is not allowed/],
    ['f(x) = x', /assignment is not allowed/],
    ['foo > 1 and bar < 2', /unknown names "foo", "bar"/],
    ['knock > 0', /the log has no "knock" channel/],
    ['pi > 3', /unknown name "pi"/],
    ['tps == "40"', /constants must be numbers/],
    ['[1, 2]', /a matrix/],
    ['rpm.constructor', /property or index access/],
    ['rpm[1]', /property or index access/],
    ['rpm > 1; tps > 2', /more than one statement/],
    ['1:3', /a range/],
    ['rpm!', /operator "!" is not allowed/],
    ['5 cm > 1', /unknown name "cm"/],
    ['rpm >', /cannot be read/],
  ])('When given "%s", then it throws naming what is refused', (source, message) => {
    const call = () => compileSampleExpression(source, present);
    expect(call).toThrow(SampleExpressionError);
    expect(call).toThrow(message);
  });

  it('When the text is empty, then it throws naming the argument', () => {
    expect(() => compileSampleExpression('  ', present)).toThrow(/source/);
  });

  it('When the result is not a number or a boolean, then evaluation throws', () => {
    // The check refuses matrices, so this reaches evaluation only through a hand-made object.
    const expression = { source: 'x', channels: [], code: { evaluate: () => 'text' } };
    expect(() => evaluateSampleExpression(expression, log)).toThrow(/gave a string/);
  });
});

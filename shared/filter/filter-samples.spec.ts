import { type Channel, type ColumnarLog } from '../core/channels';
import { DEFAULT_FILTER_RULES, type FilterRule } from './filter-rules';
import { filterSamples } from './filter-samples';

/** A log from plain arrays; time defaults to 0.1 s steps. */
function makeLog(columns: Partial<Record<Channel, number[]>>): ColumnarLog {
  const length = Object.values(columns)[0]?.length ?? 0;
  const channels: Partial<Record<Channel, Float64Array>> = {
    time: Float64Array.from({ length }, (_, i) => i / 10),
  };
  for (const [name, values] of Object.entries(columns)) {
    channels[name as Channel] = Float64Array.from(values);
  }
  return { length, channels };
}

/** Indices of removed samples. */
function removedIndices(keep: Uint8Array): number[] {
  return Array.from(keep.entries())
    .filter(([, k]) => k === 0)
    .map(([i]) => i);
}

// Hand-built logs; every expected count is worked out by hand from the rule's definition
// (common practice, no published source, for the thresholds themselves).
describe('filterSamples, one rule at a time', () => {
  const flat = (v: number, n = 15) => Array.from({ length: n }, () => v);
  // Throttle holds 0, steps to 2 then 4 (%): with a 3-sample window the rate is the central
  // difference, 20 %/s at sample 5 only; 10 %/s at samples 4 and 6.
  const tps = [0, 0, 0, 0, 0, 2, 4, 4, 4, 4, 4, 4, 4, 4, 4];
  const threeSampleWindow = { rateWindowS: 0.2 };

  it.each<[string, Partial<Record<Channel, number[]>>, FilterRule, number[]]>([
    [
      'warm-up below 70 °C (NaN is unknown)',
      { ect: [60, 69.9, 70, 80, NaN] },
      { kind: 'warmUp' },
      [0, 1, 4],
    ],
    [
      'warm-up with its own limit',
      { ect: [60, 69.9, 70, 80] },
      { kind: 'warmUp', minEctC: 65 },
      [0],
    ],
    [
      'fuel cut by flag, 1 s settle',
      { fuelCut: [0, 0, 1, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0] },
      { kind: 'fuelCut', settleS: 1 },
      // cut at 0.2–0.3 s; settle to 1.3 s reaches sample 13
      [2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13],
    ],
    [
      'fuel cut by lambda at the lean limit, 0.2 s settle',
      { lambda: [1, 1, 1.6, 1.59, 1, 1, 1, 1.7, 1, 1] },
      { kind: 'fuelCut', settleS: 0.2 },
      [2, 3, 4, 7, 8, 9],
    ],
    [
      'throttle rate above 15 %/s and 0.5 s after',
      { tps },
      { kind: 'tipIn', maxTpsRatePctPerS: 15, settleS: 0.5 },
      [5, 6, 7, 8, 9, 10],
    ],
    [
      'throttle rate above 5 %/s, no settle',
      { tps },
      { kind: 'tipIn', maxTpsRatePctPerS: 5, settleS: 0 },
      [4, 5, 6],
    ],
    [
      'throttle closing ignored when only openings count',
      { tps: tps.map((v) => 4 - v) },
      { kind: 'tipIn', maxTpsRatePctPerS: 5, settleS: 0, direction: 'opening' },
      [],
    ],
    [
      'RPM rate above 300 rpm/s',
      // +50 rpm per 0.1 s from sample 5 to 9: central differences 250, 500, 500, 500, 250 rpm/s
      { rpm: [2000, 2000, 2000, 2000, 2000, 2000, 2050, 2100, 2150, 2200, 2200, 2200, 2200] },
      { kind: 'rpmRate' },
      [6, 7, 8],
    ],
    [
      'MAP rate above 20 kPa/s with 0.3 s settle',
      { map: [50, 50, 50, 50, 53, 56, 56, 56, 56, 56, 56, 56] },
      { kind: 'mapRate', settleS: 0.3 },
      // central differences 15, 30, 15 kPa/s at samples 3–5: fast at 4 only; settle to 0.7 s
      [4, 5, 6, 7],
    ],
    [
      'lambda outside 0.65–1.3',
      { lambda: [0.6, 0.65, 1.0, 1.3, 1.31, NaN] },
      { kind: 'lambdaRange' },
      [0, 4, 5],
    ],
    [
      'closed loop only',
      { closedLoop: [1, 0, 1, 0, 1] },
      { kind: 'loopMode', keep: 'closed' },
      [1, 3],
    ],
    [
      'open loop only',
      { closedLoop: [1, 0, 1, 0, 1] },
      { kind: 'loopMode', keep: 'open' },
      [0, 2, 4],
    ],
    ['knock above 1°', { knock: [0, 0.5, 1, 1.5, 4] }, { kind: 'knock', maxDeg: 1 }, [3, 4]],
    [
      'user expression',
      { rpm: [1000, 1600, 2500, 4000], tps: [10, 50, 95, 20] },
      { kind: 'expression', source: 'rpm > 1500 and tps < 90' },
      [0, 2],
    ],
    [
      'steady log under the default rate rules',
      { tps: flat(20), rpm: flat(3000) },
      { kind: 'rpmRate' },
      [],
    ],
  ])('When %s, then exactly the expected samples go', (_name, columns, rule, expected) => {
    const log = makeLog(columns);
    const { keep, funnel, total } = filterSamples(log, [rule], threeSampleWindow);
    expect(removedIndices(keep)).toEqual(expected);
    expect(funnel).toHaveLength(1);
    expect(funnel[0]).toMatchObject({
      rule: rule.kind,
      status: 'applied',
      removed: expected.length,
      remaining: total - expected.length,
    });
  });
});

describe('filterSamples, the funnel', () => {
  // Sample 0 is cold and lean-out-of-range, 1 only cold, 2 only out of range, 3 fine.
  const log = makeLog({ ect: [50, 50, 90, 90], lambda: [1.5, 1.0, 0.5, 1.0] });

  it('When rules overlap, then each counts only samples still kept, in the order given', () => {
    const first = filterSamples(log, [{ kind: 'warmUp' }, { kind: 'lambdaRange' }]);
    expect(first.funnel.map((s) => [s.rule, s.removed, s.remaining])).toEqual([
      ['warmUp', 2, 2],
      ['lambdaRange', 1, 1],
    ]);
    const swapped = filterSamples(log, [{ kind: 'lambdaRange' }, { kind: 'warmUp' }]);
    expect(swapped.funnel.map((s) => [s.rule, s.removed, s.remaining])).toEqual([
      ['lambdaRange', 2, 2],
      ['warmUp', 1, 1],
    ]);
    expect(removedIndices(first.keep)).toEqual(removedIndices(swapped.keep));
  });

  it('When a channel is missing, then its rule is skipped and the funnel says which', () => {
    const { funnel } = filterSamples(log, [
      { kind: 'knock' },
      { kind: 'tipIn' },
      { kind: 'warmUp' },
    ]);
    expect(funnel[0]).toMatchObject({ status: 'skipped', removed: 0, remaining: 4 });
    expect(funnel[0].note).toMatch(/"knock"/);
    expect(funnel[1].note).toMatch(/"tps"/);
    expect(funnel[2]).toMatchObject({ status: 'applied', removed: 2, remaining: 2 });
  });

  it('When the default rules run, then each has a labelled step and the log is untouched', () => {
    const n = 60;
    const full = makeLog({
      ect: Array.from({ length: n }, (_, i) => (i < 10 ? 40 : 85)),
      rpm: Array.from({ length: n }, () => 3000),
      map: Array.from({ length: n }, () => 70),
      tps: Array.from({ length: n }, () => 25),
      lambda: Array.from({ length: n }, (_, i) => (i === 30 ? 2 : 0.98)),
    });
    const before = Float64Array.from(full.channels.lambda!);
    const result = filterSamples(full, DEFAULT_FILTER_RULES);
    // 10 cold samples; fuel cut at 3.0 s plus 1 s settle: samples 30–40.
    expect(result.funnel.map((s) => s.removed)).toEqual([10, 11, 0, 0, 0, 0]);
    expect(result.funnel.every((s) => s.label.length > 0)).toBe(true);
    expect(full.channels.lambda).toEqual(before);
  });

  it('When the rate window is given, then rates use that span', () => {
    // A 0.6 s window (7 samples) turns the 20 %/s central difference at sample 5 into the
    // least-squares slope Σk·y/(28·0.1 s) = 24/2.8 = 8.6 %/s, under a 10 %/s limit that the
    // 3-sample window breaks.
    const log2 = makeLog({ tps: [0, 0, 0, 0, 0, 2, 4, 4, 4, 4, 4, 4, 4, 4, 4] });
    const rule: FilterRule = { kind: 'tipIn', maxTpsRatePctPerS: 10, settleS: 0 };
    expect(filterSamples(log2, [rule], { rateWindowS: 0.2 }).funnel[0].removed).toBe(1);
    expect(filterSamples(log2, [rule], { rateWindowS: 0.6 }).funnel[0].removed).toBe(0);
  });
});

describe('filterSamples, argument checks', () => {
  const log = makeLog({ ect: [80, 80, 80] });
  it.each<[string, () => unknown, RegExp]>([
    ['bad rate window', () => filterSamples(log, [], { rateWindowS: 0 }), /rateWindowS/],
    [
      'negative settle',
      () => filterSamples(log, [{ kind: 'fuelCut', settleS: -1 }]),
      /rules\[0\]\.settleS/,
    ],
    [
      'zero rpm limit',
      () => filterSamples(log, [{ kind: 'rpmRate', maxRpmPerS: 0 }]),
      /maxRpmPerS/,
    ],
    ['min above max', () => filterSamples(log, [{ kind: 'lambdaRange', min: 1.2, max: 1 }]), /max/],
    [
      'unknown rule',
      () => filterSamples(log, [{ kind: 'nope' } as unknown as FilterRule]),
      /"nope"/,
    ],
    [
      'time going back',
      () => filterSamples({ length: 2, channels: { time: Float64Array.from([1, 0]) } }, []),
      /ascend/,
    ],
    ['no time channel', () => filterSamples({ length: 0, channels: {} }, []), /"time"/],
  ])('When %s, then it throws naming the argument', (_name, call, message) => {
    expect(call).toThrow(message);
  });
});

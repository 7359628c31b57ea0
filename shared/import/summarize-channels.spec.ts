import { shareAbove, summarizeChannels } from './summarize-channels';

describe('summarizeChannels', () => {
  it('When a channel has NaN samples, then they are counted and left out of min, max and mean', () => {
    const log = {
      length: 4,
      channels: {
        rpm: Float64Array.from([800, NaN, 1200, 1000]),
        iat: Float64Array.from([NaN, NaN, NaN, NaN]),
      },
    };
    const summary = summarizeChannels(log);
    expect(summary.rpm).toEqual({ min: 800, max: 1200, mean: 1000, nanCount: 1 });
    expect(summary.iat).toEqual({ min: NaN, max: NaN, mean: NaN, nanCount: 4 });
    expect(summary.map).toBeUndefined();
  });

  it('When log is not a log, then the error names it', () => {
    expect(() => summarizeChannels(null as never)).toThrow(/log/);
  });
});

describe('per-mille figures and shareAbove', () => {
  const ramp = (n: number) => Float64Array.from({ length: n }, (_, i) => i);

  it('When a channel is asked for, then its 1001 figures run from its smallest to its largest', () => {
    const summary = summarizeChannels({ length: 2001, channels: { map: ramp(2001) } }, ['map']);
    const permille = summary.map?.permille as readonly number[];
    expect(permille).toHaveLength(1001);
    expect(permille[0]).toBe(0);
    expect(permille[500]).toBe(1000);
    expect(permille[1000]).toBe(2000);
  });

  it('When a channel is not asked for, then it has no figures', () => {
    const summary = summarizeChannels({ length: 10, channels: { rpm: ramp(10) } });
    expect(summary.rpm?.permille).toBeUndefined();
  });

  it('When a quarter of the samples lie above a limit, then about a quarter is said', () => {
    const summary = summarizeChannels({ length: 4000, channels: { map: ramp(4000) } }, ['map']);
    const permille = summary.map?.permille as readonly number[];
    expect(shareAbove(permille, 2999.5)).toBeCloseTo(0.25, 2);
    expect(shareAbove(permille, 3999)).toBe(0);
    expect(shareAbove(permille, -1)).toBe(1);
  });
});

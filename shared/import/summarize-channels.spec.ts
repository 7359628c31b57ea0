import { summarizeChannels } from './summarize-channels';

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

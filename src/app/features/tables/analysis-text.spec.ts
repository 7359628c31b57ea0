import type { LogResource } from '@shared/contracts/logs';
import type { LeanFlag, LogFilterReport } from '../../core/api/analyses-api';
import { delayLine, keptLine, leanFlagLine, logLine } from './analysis-text';

const REPORT: LogFilterReport = {
  logId: 'l1',
  samples: 20000,
  kept: 12500,
  funnel: [],
  delayUsed: { tau0S: 0.1234, kGrams: 1.5, source: 'estimate' },
};

const FLAG: LeanFlag = {
  row: 12,
  col: 9,
  rpm: 4500,
  mapKpa: 160,
  leanPercent: 6.44,
  worstLeanPercent: 11.2,
  severity: 'abort',
};

describe('analysis text', () => {
  it.each([
    [
      { kind: 'road', durationS: 600, sampleCount: 12000 },
      'a.csv (road, 10.0 min, 12,000 samples)',
    ],
    [{ kind: 'dyno', durationS: null, sampleCount: null }, 'a.csv (dyno)'],
  ] as const)('When the log is %j, then it reads %j', (fields, line) => {
    expect(logLine({ fileName: 'a.csv', ...fields } as LogResource)).toBe(line);
  });

  it.each([
    [REPORT, 'Wideband delay τ₀ 0.123 s, K 1.50 g (estimated from this log).'],
    [
      { ...REPORT, delayUsed: { tau0S: 0.1, kGrams: 1, source: 'settings' } },
      'Wideband delay τ₀ 0.100 s, K 1.00 g (from the settings).',
    ],
  ] as const)('When the delay is %j, then it reads %j', (report, line) => {
    expect(delayLine(report)).toBe(line);
  });

  it.each([
    [REPORT, '12,500 of 20,000 samples kept (63 %).'],
    [{ ...REPORT, samples: 0, kept: 0 }, '0 of 0 samples kept (0 %).'],
  ])('When samples are counted, then the line is %j', (report, line) => {
    expect(keptLine(report)).toBe(line);
  });

  it.each([
    [FLAG, '4500 rpm × 160 kPa: 6.4 % lean on average, worst 11.2 % (stop)'],
    [
      { ...FLAG, worstLeanPercent: null, severity: 'warn' },
      '4500 rpm × 160 kPa: 6.4 % lean on average (warning)',
    ],
  ] as const)('When the flag is %j, then it reads %j', (flag, line) => {
    expect(leanFlagLine(flag)).toBe(line);
  });
});

import type { LogResource } from '@shared/contracts/logs';
import type { LeanFlag, LogFilterReport } from '../../core/api/analyses-api';
import {
  delayLine,
  keptLine,
  leanFlagLine,
  lockedLine,
  logLine,
  previewSummaryLine,
} from './analysis-text';
import type { PreviewSummary } from './proposal-preview-compute';

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

  const SUMMARY: PreviewSummary = {
    changed: 12,
    meanChangePct: 2.345,
    largestChangePct: -7.96,
    largestAt: [1, 2],
    richer: 9,
    leaner: 3,
  };

  it.each<[PreviewSummary, string]>([
    [
      SUMMARY,
      '12 cells change: mean +2.3 %, largest \u22128.0 % at 3000 rpm × 70 kPa; 9 richer (VE up), 3 leaner (VE down).',
    ],
    [
      { ...SUMMARY, changed: 1, meanChangePct: 0.01, largestChangePct: 0.01, largestAt: null },
      '1 cell changes: mean 0.0 %, largest 0.0 %; 9 richer (VE up), 3 leaner (VE down).',
    ],
    [{ ...SUMMARY, changed: 0 }, 'No cell changes with these options.'],
  ])('When the preview summary is %j, then it reads %j', (summary, line) => {
    expect(previewSummaryLine(summary, [1000, 2000, 3000], [40, 70, 100])).toBe(line);
  });

  it.each([
    [0, 'No cells are locked.'],
    [1, '1 locked cell keeps its value.'],
    [1200, '1,200 locked cells keep their value.'],
  ])('When %d cells are locked, then it reads %j', (count, line) => {
    expect(lockedLine(count)).toBe(line);
  });
});

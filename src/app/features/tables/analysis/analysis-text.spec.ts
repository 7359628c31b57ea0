import type { LogResource } from '@shared/contracts/logs';
import type { LeanFlag, LogFilterReport } from '../../../core/api/analyses-api';
import { ASSUMED_GUARD } from '../../../../testing/table-fixtures';
import {
  LEAN_SEVERITY,
  LEAN_WORDS_EXPLAINED,
  delayLine,
  guardLine,
  heldLine,
  keptLine,
  leanCountText,
  leanFlagLine,
  lockedLine,
  logLine,
  originLine,
  previewSummaryLine,
  watchLine,
} from './analysis-text';
import type { PreviewSummary } from '../preview/proposal-preview-compute';

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
  weight: 42,
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
    [
      { ...FLAG, worstLeanPercent: null, weight: 0.3, severity: 'watch' },
      '4500 rpm × 160 kPa: 6.4 % lean on average (watch)',
    ],
  ] as const)('When the flag is %j, then it reads %j', (flag, line) => {
    expect(leanFlagLine(flag)).toBe(line);
  });

  it('When the severities are worded, then “stop” and “warning” say what to do', () => {
    expect(LEAN_SEVERITY.abort).toEqual({
      word: 'stop',
      action: 'stop loading the engine in this cell until it is richer',
    });
    expect(LEAN_SEVERITY.warn.word).toBe('warning');
    expect(LEAN_WORDS_EXPLAINED).toContain('“Stop”: stop loading the engine');
    expect(LEAN_WORDS_EXPLAINED).toContain('“Warning”: richen the cell before the next full-load');
  });

  it.each<[LeanFlag['severity'][], string]>([
    [['abort', 'warn'], '2 lean-under-load flags'],
    [['abort'], '1 lean-under-load flag'],
    [['warn', 'watch', 'watch'], '1 lean-under-load flag, 2 more to watch (too little data)'],
    [['watch'], '0 lean-under-load flags, 1 more to watch (too little data)'],
  ])('When the flags are %j, then they are counted as %j', (severities, text) => {
    expect(leanCountText(severities.map((severity) => ({ ...FLAG, severity })))).toBe(text);
  });

  it.each([
    [1, '1 cell looks lean but rests on too little data: log it again.'],
    [8, '8 cells look lean but rest on too little data: log them again.'],
  ])('When %d cells are only watched, then the line is %j', (count, line) => {
    expect(watchLine(count)).toBe(line);
  });

  it.each([
    [12, true, '12 cells held under load: need data.'],
    [1, true, '1 cell held under load: needs data.'],
    [0, true, 'No cell held under load.'],
    [0, false, 'Fuel-safety guard off: no cell is held under load.'],
  ])('When %d cells are held (guard on: %p), then it reads %j', (count, isOn, line) => {
    expect(heldLine(count, isOn)).toBe(line);
  });

  it('When the origins are counted, then kinds with no cell are left out but measured and filled', () => {
    expect(originLine({ measured: 70, filled: 500, held: 12, locked: 0, unchanged: 66 })).toBe(
      'Cells: 70 measured, 500 filled from neighbours, 12 held, 66 unchanged.',
    );
    expect(originLine({ measured: 0, filled: 0, held: 0, locked: 3, unchanged: 9 })).toBe(
      'Cells: 0 measured, 0 filled from neighbours, 3 locked, 9 unchanged.',
    );
  });

  it.each([
    [
      'metric',
      ASSUMED_GUARD,
      'Load line 91.2 kPa (90 % of 101.3 kPa barometric pressure, assumed as standard sea-level pressure: the logs hold no barometer or engine-off MAP); lean allowance 1 %.',
    ],
    [
      'imperial',
      { ...ASSUMED_GUARD, loadLineKpa: 76.5, baroKpa: 85, baroSource: 'logged' },
      // 76.5 kPa / 6.894757 = 11.0954 psi; 85 / 6.894757 = 12.328 psi (NIST SP 811, App. B.8).
      'Load line 11.1 psi(a) (90 % of 12.33 psi(a) barometric pressure, read from the logs’ barometer); lean allowance 1 %.',
    ],
    [
      'metric',
      { ...ASSUMED_GUARD, baroSource: 'engine_off', leanAllowancePercent: 0.5 },
      'Load line 91.2 kPa (90 % of 101.3 kPa barometric pressure, read from MAP while the engine stood still); lean allowance 0.5 %.',
    ],
  ] as const)('When the guard is shown in %s, then it reads as expected', (units, guard, line) => {
    expect(guardLine(guard, units)).toBe(line);
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

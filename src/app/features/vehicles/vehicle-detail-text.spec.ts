import type { RevisionSummary } from '@shared/contracts/tables';
import {
  breakpointsText,
  durationText,
  isLogPending,
  latestRevisions,
  logStatusText,
  mapRangeText,
} from './vehicle-detail-text';

describe('logStatusText', () => {
  it.each([
    ['queued', 0, 'Queued'],
    ['parsing', 0.404, 'Parsing 40 %'],
    ['parsing', 1.2, 'Parsing 100 %'],
    ['ready', 1, 'Ready'],
    ['failed', 0.3, 'Failed'],
  ] as const)('When a log is %s at %p, then its chip says %p', (status, progress, text) => {
    expect(logStatusText({ status, progress })).toBe(text);
    expect(isLogPending({ status })).toBe(status === 'queued' || status === 'parsing');
  });
});

describe('durationText', () => {
  it.each([
    [null, '—'],
    [-1, '—'],
    [0, '0 s'],
    [44.6, '45 s'],
    [725, '12 min 05 s'],
    [3720, '1 h 02 min'],
  ])('When a log lasts %p s, then it reads %p', (seconds, text) => {
    expect(durationText(seconds)).toBe(text);
  });
});

describe('breakpointsText', () => {
  it('When a table has 16 RPM and 12 MAP breakpoints, then it says so', () => {
    const table = { rpmAxis: Array(16).fill(0), mapAxisKpa: Array(12).fill(0) };
    expect(breakpointsText(table)).toBe('16 RPM × 12 MAP breakpoints');
  });
});

describe('mapRangeText', () => {
  it.each([
    ['metric', 'MAP 20–250 kPa'],
    // 20 kPa / 6.894757 = 2.90 psi, 250 kPa = 36.26 psi (NIST SP 811 B.8 factor, units.ts)
    ['imperial', 'MAP 2.9–36.26 psi(a)'],
  ] as const)('When a table spans 20–250 kPa in %p, then it reads %p', (units, text) => {
    expect(mapRangeText({ mapAxisKpa: [20, 40, 100, 250] }, units)).toBe(text);
  });

  it('When a table has no MAP breakpoints, then the text is empty', () => {
    expect(mapRangeText({ mapAxisKpa: [] }, 'imperial')).toBe('');
  });
});

describe('latestRevisions', () => {
  const revision = (number: number): RevisionSummary => ({
    id: `r${number}`,
    tableId: 't1',
    parentId: null,
    number,
    status: 'draft',
    message: '',
    authorId: 'u1',
    authorName: 'Test Tuner',
    analysisId: null,
    createdAt: '2026-01-01T00:00:00.000Z',
  });

  it.each([
    [[1, 2, 3, 4], 3, [4, 3, 2]],
    [[1, 2], 3, [2, 1]],
    [[], 3, []],
    [[1, 2], 0, []],
  ])('When numbers %p are listed, the %p latest are %p', (numbers, count, expected) => {
    expect(latestRevisions(numbers.map(revision), count).map((r) => r.number)).toEqual(expected);
  });
});

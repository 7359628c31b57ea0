import { HttpErrorResponse } from '@angular/common/http';
import {
  beyondTableText,
  canUploadLogs,
  formatBytes,
  formatDuration,
  isPending,
  sentFraction,
  statusLabel,
  uploadFailure,
} from './log-text';

/** An API error answer with the given status and details. */
function apiError(status: number, details?: unknown): HttpErrorResponse {
  return new HttpErrorResponse({
    status,
    error: { error: { code: 'x', message: `server says ${status}`, details } },
  });
}

describe('statusLabel', () => {
  it.each([
    ['queued', 0, 'Queued', true],
    ['parsing', 0.404, 'Parsing 40 %', true],
    ['parsing', 1.2, 'Parsing 100 %', true],
    ['ready', 1, 'Ready', false],
    ['failed', 0.3, 'Failed', false],
  ] as const)(
    'When a log is %s at %p, then its chip says %p',
    (status, progress, text, pending) => {
      expect(statusLabel({ status, progress })).toBe(text);
      expect(isPending({ status })).toBe(pending);
    },
  );
});

describe('formatDuration', () => {
  it.each([
    [null, '—'],
    [-1, '—'],
    [Number.NaN, '—'],
    [0, '0 s'],
    [44.6, '45 s'],
    [725, '12 min 05 s'],
    [3720, '1 h 02 min'],
  ])('When a log lasts %p s, then it reads %p', (seconds, text) => {
    expect(formatDuration(seconds)).toBe(text);
  });
});

describe('formatBytes', () => {
  it.each([
    [812, '812 B'],
    [4200, '4.2 KB'],
    [512_000_000, '512.0 MB'],
  ])('When a size is %p bytes, then it reads %p', (bytes, text) => {
    expect(formatBytes(bytes)).toBe(text);
  });
});

describe('uploadFailure', () => {
  it.each([
    [
      '422 missing channels',
      apiError(422, { missing: ['lambdaTarget', 'map'] }),
      'No column found for: lambdaTarget, map.',
      null,
    ],
    [
      '422 unknown column',
      apiError(422, { reason: 'unknown_column', missing: ['afr_1'], row: 0 }),
      'The mapping names columns this file does not have: afr_1.',
      null,
    ],
    ['422 without a list', apiError(422), 'server says 422', null],
    [
      '409 duplicate',
      apiError(409, { logId: 'log-1' }),
      'This vehicle already has a log with exactly this content.',
      'log-1',
    ],
    [
      '413 with a limit',
      apiError(413, { maxBytes: 512_000_000 }),
      'The file is larger than the 512.0 MB limit.',
      null,
    ],
    ['413 without one', apiError(413), 'The file is larger than the server accepts.', null],
    ['400 no data', apiError(400, { reason: 'no_data' }), 'server says 400', null],
    ['not an HTTP error', new Error('x'), 'The upload failed.', null],
  ])('When the upload fails with %s, then it says so', (_case, error, message, existingLogId) => {
    expect(uploadFailure(error)).toEqual({ message, existingLogId });
  });
});

describe('sentFraction', () => {
  it.each([
    [50, 200, 0.25],
    [300, 200, 1],
    [10, undefined, null],
    [10, 0, null],
  ])('When %p of %p bytes are sent, then the fraction is %p', (loaded, total, fraction) => {
    expect(sentFraction(loaded, total)).toBe(fraction);
  });
});

describe('canUploadLogs', () => {
  it.each([
    [['tuner'], true],
    [['operator'], true],
    [['reviewer'], false],
    [['admin'], false],
  ] as const)('When a member holds %p, then uploading is %p', (roles, allowed) => {
    expect(canUploadLogs(roles)).toBe(allowed);
  });
});

describe('beyondTableText', () => {
  const beyond = {
    tableId: 't',
    tableName: 'Main VE',
    rpmTop: 7000,
    logRpmMax: 6500,
    mapTopKpa: 105,
    logMapMaxKpa: 196.2,
    shareAboveRpm: 0,
    shareAboveMap: 0.184,
  };

  it('When a boost log meets a table ending at 105 kPa, then it says the share above in kPa', () => {
    expect(beyondTableText(beyond, 'metric')).toMatch(
      /^Runs past the top of “Main VE”: 18 % of the samples are above its top MAP of 105(\.0)? kPa \(the log reaches 196(\.2)? kPa\)\./,
    );
  });

  it('When the user prefers imperial, then the pressures read in psi(a)', () => {
    expect(beyondTableText(beyond, 'imperial')).toContain('psi(a)');
  });

  it('When the log also passes the top RPM and the shares are unknown, then it says "some"', () => {
    const text = beyondTableText(
      { ...beyond, logRpmMax: 7400, shareAboveRpm: null, shareAboveMap: null },
      'metric',
    );
    expect(text).toContain('some of the samples are above its top MAP');
    expect(text).toContain('some are above its top RPM of 7000 (the log reaches 7400)');
  });
});

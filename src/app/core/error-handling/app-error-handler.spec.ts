import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { noAnimations } from '../../../testing/harness-helpers';
import { AppErrorHandler, isChunkLoadFailure } from './app-error-handler';

const GENERIC_MESSAGE = 'Something went wrong. The details are in the browser console.';

describe('AppErrorHandler', () => {
  let handler: AppErrorHandler;
  let open: jest.SpyInstance;
  let consoleError: jest.SpyInstance;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [AppErrorHandler, noAnimations] });
    handler = TestBed.inject(AppErrorHandler);
    // The real snack bar still opens, so the chained onAction() of the reload offer works.
    open = jest.spyOn(TestBed.inject(MatSnackBar), 'open');
    // Logging is the behaviour under test; keep it out of the test output.
    consoleError = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  });

  afterEach(() => {
    TestBed.inject(MatSnackBar).dismiss();
    consoleError.mockRestore();
  });

  it('when an API answer has the error shape, then it shows the server message', () => {
    const error = new HttpErrorResponse({
      error: { error: { code: 'conflict', message: 'That address is already invited' } },
      status: 409,
      statusText: 'Conflict',
      url: '/api/team/invitations',
    });

    handler.handleError(error);

    expect(open).toHaveBeenCalledWith('That address is already invited', 'Dismiss', {
      duration: 8000,
    });
    expect(consoleError).toHaveBeenCalledWith(error);
  });

  it('when an API answer has no error shape, then it names the status', () => {
    const error = new HttpErrorResponse({ error: 'Bad Gateway', status: 502, url: '/api/meta' });

    handler.handleError(error);

    expect(open).toHaveBeenCalledWith('A request failed. (HTTP 502)', 'Dismiss', {
      duration: 8000,
    });
    expect(consoleError).toHaveBeenCalledWith(error);
  });

  it('when a lazy chunk fails to load, then it offers a reload', () => {
    const error = new TypeError(
      'Failed to fetch dynamically imported module: https://cellsmith.example/chunk-AB12.js',
    );

    handler.handleError(error);

    expect(open).toHaveBeenCalledWith(
      'Part of Cellsmith failed to load; a newer version may be out.',
      'Reload',
    );
    expect(consoleError).toHaveBeenCalledWith(error);
  });

  it.each<[string, unknown]>([
    ['an Error', new Error('cannot read properties of undefined')],
    ['a thrown string', 'plain failure'],
    ['undefined', undefined],
  ])('when %s is thrown, then it shows the generic message', (_label, error) => {
    handler.handleError(error);

    expect(open).toHaveBeenCalledWith(GENERIC_MESSAGE, 'Dismiss', { duration: 8000 });
    expect(consoleError).toHaveBeenCalledWith(error);
  });
});

describe('isChunkLoadFailure', () => {
  it.each<[unknown, boolean]>([
    [new TypeError('Failed to fetch dynamically imported module: /chunk-1.js'), true],
    [new TypeError('error loading dynamically imported module: /chunk-1.js'), true],
    [new TypeError('Importing a module script failed.'), true],
    [new Error('Loading chunk team-routes failed.'), true],
    [new Error('Failed to fetch'), false],
    ['something else', false],
  ])('classifies %p as %p', (error, expected) => {
    expect(isChunkLoadFailure(error)).toBe(expected);
  });
});

import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ApplicationRef, ErrorHandler } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { SessionUser } from '@shared/contracts/auth';
import type { DisplayPreferenceValues } from '@shared/contracts/preferences';
import { Session } from '../auth/session';
import { DisplayPreferences } from './display-preferences';

const USER: SessionUser = {
  id: 'u1',
  email: 'tuner@example.test',
  name: 'Test Tuner',
  roles: ['tuner'],
  shopId: 's1',
  shopName: 'Test Shop',
};

const URL = '/api/me/preferences';
const STORED: DisplayPreferenceValues = { units: 'imperial', mixture: 'afr', theme: 'dark' };
const REFUSED = { error: { code: 'internal', message: 'The database is away' } };

describe('DisplayPreferences', () => {
  let http: HttpTestingController;
  let session: Session;
  let prefs: DisplayPreferences;
  let snack: jest.Mock;
  let reported: jest.Mock;

  beforeEach(() => {
    localStorage.clear();
    document.documentElement.className = '';
    snack = jest.fn();
    reported = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snack } },
        { provide: ErrorHandler, useValue: { handleError: reported } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    session = TestBed.inject(Session);
    prefs = TestBed.inject(DisplayPreferences);
  });

  afterEach(() => http.verify());

  /** Lets resources and effects settle (a resource takes its answer in a microtask). */
  async function settle(): Promise<void> {
    TestBed.tick();
    await TestBed.inject(ApplicationRef).whenStable();
  }

  /** Signs USER in and answers the preferences request with `stored`. */
  async function signInWith(stored: DisplayPreferenceValues): Promise<void> {
    session.signIn(USER.email, 'pw').subscribe();
    http.expectOne('/api/auth/login').flush({ user: USER });
    TestBed.tick();
    http.expectOne({ method: 'GET', url: URL }).flush(stored);
    await settle();
  }

  it('When nobody is signed in, then the defaults hold, the remembered scheme applies, no request goes', async () => {
    localStorage.setItem('cellsmith.color-scheme', 'light');
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    const signedOut = TestBed.inject(DisplayPreferences);
    TestBed.tick();

    expect(signedOut.preferences()).toEqual({ units: 'metric', mixture: 'lambda', theme: 'light' });
    expect(signedOut.loaded()).toBe(false);
    TestBed.inject(HttpTestingController).expectNone(URL);
  });

  it('When a user signs in, then the stored preferences load and the scheme is applied', async () => {
    await signInWith(STORED);

    expect(prefs.preferences()).toEqual(STORED);
    expect(prefs.loaded()).toBe(true);
    expect(document.documentElement.classList.contains('cs-scheme-dark')).toBe(true);
    expect(localStorage.getItem('cellsmith.color-scheme')).toBe('dark');
  });

  it('When the browser remembers light but the server says dark, then the server wins', async () => {
    localStorage.setItem('cellsmith.color-scheme', 'light');
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    session = TestBed.inject(Session);
    prefs = TestBed.inject(DisplayPreferences);
    TestBed.tick();
    expect(prefs.theme()).toBe('light');

    await signInWith(STORED);
    expect(prefs.theme()).toBe('dark');
    expect(document.documentElement.classList.contains('cs-scheme-light')).toBe(false);
  });

  it('When the user signs out, then units and mixture go back to the defaults', async () => {
    await signInWith(STORED);
    session.clear();
    await settle();

    expect(prefs.units()).toBe('metric');
    expect(prefs.mixture()).toBe('lambda');
    expect(prefs.loaded()).toBe(false);
    // The sign-in page keeps the scheme last applied, as remembered in this browser.
    expect(prefs.theme()).toBe('dark');
  });

  it('When a preference changes, then it shows at once and only that field is PATCHed', async () => {
    await signInWith({ units: 'metric', mixture: 'lambda', theme: 'system' });
    prefs.change({ units: 'imperial' });

    expect(prefs.units()).toBe('imperial');
    const request = http.expectOne({ method: 'PATCH', url: URL });
    expect(request.request.body).toEqual({ units: 'imperial' });
    request.flush({ units: 'imperial', mixture: 'lambda', theme: 'system' });
    expect(prefs.units()).toBe('imperial');
    expect(snack).not.toHaveBeenCalled();
  });

  it('When the server refuses a change, then the previous choice comes back with a snackbar', async () => {
    await signInWith({ units: 'metric', mixture: 'lambda', theme: 'light' });
    prefs.change({ theme: 'dark' });
    TestBed.tick();
    expect(document.documentElement.classList.contains('cs-scheme-dark')).toBe(true);

    http
      .expectOne({ method: 'PATCH', url: URL })
      .flush(REFUSED, { status: 500, statusText: 'Server Error' });
    await settle();

    expect(prefs.theme()).toBe('light');
    expect(document.documentElement.classList.contains('cs-scheme-light')).toBe(true);
    expect(snack).toHaveBeenCalledWith(
      'Your colour scheme could not be saved: The database is away',
      'Dismiss',
      expect.anything(),
    );
  });

  it('When two changes follow quickly, then they go one after the other and both stay shown', async () => {
    await signInWith({ units: 'metric', mixture: 'lambda', theme: 'system' });
    prefs.change({ units: 'imperial' });
    prefs.change({ mixture: 'afr' });

    expect(prefs.preferences()).toMatchObject({ units: 'imperial', mixture: 'afr' });
    const first = http.expectOne({ method: 'PATCH', url: URL });
    expect(first.request.body).toEqual({ units: 'imperial' });
    // The answer to the first still says lambda; the second change stays shown meanwhile.
    first.flush({ units: 'imperial', mixture: 'lambda', theme: 'system' });
    expect(prefs.mixture()).toBe('afr');

    const second = http.expectOne({ method: 'PATCH', url: URL });
    expect(second.request.body).toEqual({ mixture: 'afr' });
    second.flush({ units: 'imperial', mixture: 'afr', theme: 'system' });
    expect(prefs.preferences()).toEqual({ units: 'imperial', mixture: 'afr', theme: 'system' });
  });

  it('When a refused change was followed by an accepted one, then only the refused one reverts', async () => {
    await signInWith({ units: 'metric', mixture: 'lambda', theme: 'system' });
    prefs.change({ units: 'imperial' });
    prefs.change({ mixture: 'afr' });

    http
      .expectOne({ method: 'PATCH', url: URL })
      .flush(REFUSED, { status: 500, statusText: 'Server Error' });
    expect(prefs.units()).toBe('metric');
    expect(prefs.mixture()).toBe('afr');
    http
      .expectOne({ method: 'PATCH', url: URL })
      .flush({ units: 'metric', mixture: 'afr', theme: 'system' });
    expect(prefs.preferences()).toMatchObject({ units: 'metric', mixture: 'afr' });
  });

  it('When the preferences cannot be loaded, then the defaults stay and the fault is reported', async () => {
    session.signIn(USER.email, 'pw').subscribe();
    http.expectOne('/api/auth/login').flush({ user: USER });
    TestBed.tick();
    http.expectOne(URL).flush(REFUSED, { status: 500, statusText: 'Server Error' });
    await settle();

    expect(prefs.preferences()).toMatchObject({ units: 'metric', mixture: 'lambda' });
    expect(reported).toHaveBeenCalledTimes(1);
  });

  it('When signed out, then a scheme change applies in this browser only, with no request', async () => {
    prefs.change({ theme: 'dark', units: 'imperial' });
    TestBed.tick();

    expect(localStorage.getItem('cellsmith.color-scheme')).toBe('dark');
    expect(prefs.units()).toBe('metric');
    http.expectNone(URL);
  });
});

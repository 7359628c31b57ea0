import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { DisplayPreferenceValues } from '@shared/contracts/preferences';
import { PreferencesApi } from './preferences-api';

const STORED: DisplayPreferenceValues = { units: 'imperial', mixture: 'afr', theme: 'dark' };

describe('PreferencesApi', () => {
  let api: PreferencesApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    api = TestBed.inject(PreferencesApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('When the preferences are read, then it GETs /api/me/preferences', () => {
    let answer: DisplayPreferenceValues | undefined;
    api.get().subscribe((value) => (answer = value));

    const request = http.expectOne('/api/me/preferences');
    expect(request.request.method).toBe('GET');
    request.flush(STORED);
    expect(answer).toEqual(STORED);
  });

  it('When one preference changes, then it PATCHes only that field', () => {
    let answer: DisplayPreferenceValues | undefined;
    api.update({ mixture: 'afr' }).subscribe((value) => (answer = value));

    const request = http.expectOne('/api/me/preferences');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ mixture: 'afr' });
    request.flush(STORED);
    expect(answer).toEqual(STORED);
  });
});

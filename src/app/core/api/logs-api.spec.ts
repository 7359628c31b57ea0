import { HttpErrorResponse, HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { MappingPreset } from '@shared/contracts/logs';
import { firstValueFrom, lastValueFrom, toArray } from 'rxjs';
import { LogsApi } from './logs-api';

const PRESET: MappingPreset = {
  signature: 'air/fuel [afr]|a+b|rpm|time',
  name: 'Columns of a.csv',
  mapping: { channels: { rpm: { column: 'rpm' } } },
  updatedAt: '2026-03-01T10:00:00.000Z',
};

describe('LogsApi', () => {
  let api: LogsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    api = TestBed.inject(LogsApi);
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  it('When a window is asked for, then only the given fields go into the query', async () => {
    const answer = firstValueFrom(api.series('log 1', { points: 800, fromS: 12.5 }));
    const req = http.expectOne((r) => r.url === '/api/logs/log%201/series');
    expect(req.request.params.keys()).toEqual(['points', 'fromS']);
    expect(req.request.params.get('fromS')).toBe('12.5');
    req.flush({ timeS: [] });
    expect(await answer).toEqual({ timeS: [] });
  });

  it('When the shop has a preset, then it comes back; the signature goes as a query', async () => {
    const answer = firstValueFrom(api.findMappingPreset(PRESET.signature));
    const req = http.expectOne((r) => r.url === '/api/mapping-presets');
    expect(req.request.params.get('signature')).toBe(PRESET.signature);
    // Fully encoded: a bare `+` would reach the server as a space.
    expect(req.request.urlWithParams).toBe(
      '/api/mapping-presets?signature=air%2Ffuel%20%5Bafr%5D%7Ca%2Bb%7Crpm%7Ctime',
    );
    req.flush({ items: [PRESET], total: 1 });
    expect(await answer).toEqual(PRESET);
  });

  it('When the shop has no preset, then null', async () => {
    const answer = firstValueFrom(api.findMappingPreset('rpm|time'));
    http.expectOne((r) => r.url === '/api/mapping-presets').flush({ items: [], total: 0 });
    expect(await answer).toBeNull();
  });

  it('When the preset lookup fails, then the error reaches the caller', async () => {
    const answer = firstValueFrom(api.findMappingPreset('rpm|time'));
    http
      .expectOne((r) => r.url === '/api/mapping-presets')
      .flush(null, {
        status: 500,
        statusText: 'Server Error',
      });
    await expect(answer).rejects.toBeInstanceOf(HttpErrorResponse);
  });

  it('When a log is uploaded with a mapping and revision, then they go as multipart fields', async () => {
    const file = new File(['time,rpm\n0,900\n'], 'a.csv', { type: 'text/csv' });
    const events = lastValueFrom(
      api
        .upload('v1', file, { kind: 'dyno', mapping: '{"channels":{}}', ecuRevisionId: 'r1' })
        .pipe(toArray()),
    );
    const req = http.expectOne('/api/vehicles/v1/logs');
    const body = req.request.body as FormData;
    expect(body.get('kind')).toBe('dyno');
    expect(body.get('mapping')).toBe('{"channels":{}}');
    expect(body.get('ecuRevisionId')).toBe('r1');
    expect((body.get('file') as File).name).toBe('a.csv');
    req.flush({ id: 'l1', status: 'queued' }, { status: 202, statusText: 'Accepted' });
    const last = (await events).at(-1);
    expect(last?.type === HttpEventType.Response && last.body).toEqual({
      id: 'l1',
      status: 'queued',
    });
  });
});

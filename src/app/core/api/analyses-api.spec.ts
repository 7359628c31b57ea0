import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { AnalysisSamples, AnalysisSummary } from '@shared/contracts/analyses';
import type { ListResponse } from '@shared/contracts/errors';
import { AnalysesApi, type AnalysisListQuery } from './analyses-api';

const SUMMARY: AnalysisSummary = {
  id: 'a1',
  tableId: 't 1',
  baseRevisionId: 'r1',
  baseRevisionNumber: 3,
  logIds: ['l1', 'l2'],
  settings: {},
  createdAt: '2026-03-01T10:00:00.000Z',
  trustedCells: 41,
  leanFlagCount: 2,
  authorName: 'Tom Tuner',
};

const SAMPLES: AnalysisSamples = {
  rpm: [2000, 3000],
  mapKpa: [60, 95.5],
  lambdaErrorPct: [1.2, -0.4],
  logIndex: [0, 1],
  total: 2,
  returned: 2,
};

describe('AnalysesApi', () => {
  let api: AnalysesApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    api = TestBed.inject(AnalysesApi);
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  it.each<[AnalysisListQuery, string]>([
    [{}, '/api/tables/t%201/analyses'],
    [{ limit: 5 }, '/api/tables/t%201/analyses?limit=5'],
    [{ limit: 10, offset: 20 }, '/api/tables/t%201/analyses?limit=10&offset=20'],
  ])('When a table’s analyses are listed with %j, then it GETs %s', (query, url) => {
    let answer: ListResponse<AnalysisSummary> | undefined;
    api.listForTable('t 1', query).subscribe((list) => (answer = list));
    const req = http.expectOne(url);
    expect(req.request.method).toBe('GET');
    req.flush({ items: [SUMMARY], total: 1 });
    expect(answer).toEqual({ items: [SUMMARY], total: 1 });
  });

  it.each<[number | undefined, string]>([
    [undefined, '/api/analyses/a1/samples'],
    [20000, '/api/analyses/a1/samples?max=20000'],
  ])('When samples are asked with max %p, then it GETs %s', (max, url) => {
    let answer: AnalysisSamples | undefined;
    api.samples('a1', max).subscribe((samples) => (answer = samples));
    const req = http.expectOne(url);
    expect(req.request.method).toBe('GET');
    req.flush(SAMPLES);
    expect(answer).toEqual(SAMPLES);
  });

  it('When one analysis is read, then it GETs /api/analyses/:id', () => {
    api.get('a/1').subscribe();
    const req = http.expectOne('/api/analyses/a%2F1');
    expect(req.request.method).toBe('GET');
    req.flush({});
  });

  it('When the server refuses, then the error reaches the subscriber', () => {
    let status = 0;
    api.samples('a1').subscribe({ error: (error: { status: number }) => (status = error.status) });
    http.expectOne('/api/analyses/a1/samples').flush(
      { error: { code: 'conflict', message: 'Log l1 of this analysis is gone' } },
      {
        status: 409,
        statusText: 'Conflict',
      },
    );
    expect(status).toBe(409);
  });
});

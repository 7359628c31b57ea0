import type { HttpTestingController } from '@angular/common/http/testing';

/** A table `t1` of vehicle `v1` with the given axes, head revision `r1`. */
export function tableFixture(rpmAxis: number[], mapAxisKpa: number[]) {
  return {
    id: 't1',
    vehicleId: 'v1',
    name: 'Main VE',
    rpmAxis,
    mapAxisKpa,
    headRevisionId: 'r1',
    createdAt: '2026-01-01T00:00:00Z',
  };
}

/** Revision 1 (`r1`) of table `t1`, a draft holding `values`. */
export function revisionFixture(values: number[][]) {
  return {
    id: 'r1',
    tableId: 't1',
    parentId: null,
    number: 1,
    status: 'draft',
    message: 'Initial table',
    authorId: 'u1',
    authorName: 'Demo Tuner',
    analysisId: null,
    createdAt: '2026-01-01T00:00:00Z',
    values,
    // Saved from the grid, not applied from an analysis.
    applied: null,
  };
}

/**
 * Answers the requests of `TableStore.load('t1')` in the order the store makes them: the table,
 * its vehicle, revisions, head revision, the vehicle's logs (none) and the analyses (none).
 */
export function answerTableLoad(
  http: HttpTestingController,
  table: ReturnType<typeof tableFixture>,
  head: ReturnType<typeof revisionFixture>,
  revisions: readonly ReturnType<typeof revisionFixture>[] = [head],
): void {
  http.expectOne(`/api/tables/${table.id}`).flush(table);
  http
    .expectOne(`/api/vehicles/${table.vehicleId}`)
    .flush({ id: table.vehicleId, label: 'Demo hatch' });
  http
    .expectOne(`/api/tables/${table.id}/revisions`)
    .flush({ items: revisions, total: revisions.length });
  http.expectOne(`/api/revisions/${head.id}`).flush(head);
  http.expectOne(`/api/vehicles/${table.vehicleId}/logs`).flush({ items: [], total: 0 });
  http
    .expectOne((r) => r.method === 'GET' && r.url === `/api/tables/${table.id}/analyses`)
    .flush({ items: [], total: 0 });
}

/**
 * The fuel-safety guard an analysis answers with when its logs hold no barometer: the default
 * line, 90 % of standard sea-level pressure (101.325 kPa, rounded to 0.01 kPa as the server
 * does), and the default 1 % allowance.
 */
export const ASSUMED_GUARD = {
  loadLineKpa: 91.19,
  loadLinePercentOfBaro: 90,
  leanAllowancePercent: 1,
  baroKpa: 101.325,
  baroSource: 'assumed',
} as const;

import type { HttpTestingController } from '@angular/common/http/testing';
import type { AnalysisCell, AnalysisResource } from '@shared/contracts/analyses';

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
 * its vehicle, revisions, head revision and the vehicle's logs (none). The table's analyses are
 * `AnalysisStore`'s to read: {@link answerAnalysesList}.
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
}

/**
 * Answers `AnalysisStore`'s read of the table's analyses (a resource: it asks once the effects
 * have run after a head revision loaded, and again after every run) with `items`.
 */
export function answerAnalysesList(
  http: HttpTestingController,
  tableId = 't1',
  items: readonly { id: string }[] = [],
): void {
  http
    .expectOne((r) => r.method === 'GET' && r.url === `/api/tables/${tableId}/analyses`)
    .flush({ items, total: items.length });
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

/**
 * A small table for analysis tests: 3 MAP rows (40, 70, 100 kPa) by 4 RPM columns, its VE
 * `[row][col]`.
 */
export const SMALL_TABLE = {
  rpmAxis: [1000, 2000, 3000, 4000],
  mapAxisKpa: [40, 70, 100],
  values: [
    [40, 45, 50, 48],
    [60, 70, 75, 72],
    [80, 90, 95, 92],
  ],
};

/** An analysis cell measured `ratio` with `weight`; no data with weight 0. */
export function measuredCell(ratio: number, weight: number): AnalysisCell {
  const hasData = weight > 0;
  return {
    samples: hasData ? 40 : 0,
    weight,
    ratio: hasData ? ratio : null,
    spread: hasData ? 0.01 : null,
    effectiveCount: hasData ? 30 : 0,
    lambdaErrorPct: hasData ? (ratio - 1) * 100 : null,
    worstLeanPct: null,
    lambdaMeasured: hasData ? ratio : null,
    lambdaCommanded: hasData ? 1 : null,
    proposal: null,
    changePct: null,
    status: hasData ? 'trusted' : 'no_data',
  };
}

/**
 * An analysis of {@link SMALL_TABLE} run on revision `r1`: lean (1.08) on the left, rich (0.95)
 * on the right, a hole at 100 kPa × 4000 rpm. The hole sits above the guard's 91.19 kPa line and
 * its neighbours would fill it leaner, so the guard holds it. Its own trust settings: minimum
 * weight 10, largest step 6 %.
 */
export function leanRichAnalysis(): AnalysisResource {
  const cells = SMALL_TABLE.values.map((row, r) =>
    row.map((_, c) =>
      r === 2 && c === 3 ? measuredCell(1, 0) : measuredCell(c < 2 ? 1.08 : 0.95, 20),
    ),
  );
  return {
    id: 'an-1',
    tableId: 't1',
    baseRevisionId: 'r1',
    logIds: ['log-1'],
    settings: { minWeight: 10, maxStepPercent: 6 },
    cells,
    proposal: SMALL_TABLE.values.map((row) => [...row]),
    filterReport: { logs: [], samplesUsed: 5000, cellsTrusted: 11 },
    leanFlags: [],
    guard: ASSUMED_GUARD,
    createdAt: '2026-03-01T10:00:00.000Z',
  };
}

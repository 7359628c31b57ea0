import { forkJoin, map, of, switchMap, type Observable } from 'rxjs';
import type { TablesApi } from '../../core/api/tables-api';
import { revisionGroups, type RevisionGroup } from './upload-target';

/** A vehicle's tables with their revisions, as groups for an ECU-revision select. */
export function revisionGroupsOf(
  tablesApi: TablesApi,
  vehicleId: string,
): Observable<RevisionGroup[]> {
  return tablesApi.listForVehicle(vehicleId).pipe(
    switchMap(({ items }) =>
      items.length === 0
        ? of([])
        : forkJoin(
            items.map((table) =>
              tablesApi.revisions(table.id).pipe(map((res) => ({ table, revisions: res.items }))),
            ),
          ),
    ),
    map(revisionGroups),
  );
}

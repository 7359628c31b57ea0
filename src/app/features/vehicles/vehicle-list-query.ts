import type { VehicleListQuery, VehicleSort } from '../../core/api/vehicles-api';

/** A sort direction. */
export type SortOrder = 'asc' | 'desc';

/** What the vehicle list shows: the search text, the sort and the page. */
export interface VehicleListState {
  /** The search box's text, as typed. */
  search: string;
  /** The column sorted by. */
  sort: VehicleSort;
  /** The sort direction. */
  order: SortOrder;
  /** The page, counted from 0 (as `mat-paginator` counts). */
  pageIndex: number;
  /** Rows per page. */
  pageSize: number;
}

/** Page sizes offered by the paginator (the server takes at most 100). */
export const PAGE_SIZES = [10, 25, 50, 100] as const;

/** The longest search the server accepts. */
export const MAX_SEARCH_LENGTH = 100;

/** The list as it opens: every vehicle, by label A–Z, first page. */
export const INITIAL_LIST_STATE: VehicleListState = {
  search: '',
  sort: 'label',
  order: 'asc',
  pageIndex: 0,
  pageSize: 25,
};

/**
 * The `GET /api/vehicles` query for a list state: the search trimmed (and left out when blank),
 * the sort and order, and the page turned into `limit`/`offset`.
 */
export function vehicleListQuery(state: VehicleListState): VehicleListQuery {
  const q = state.search.trim().slice(0, MAX_SEARCH_LENGTH);
  const limit = Math.min(100, Math.max(1, Math.floor(state.pageSize)));
  const offset = Math.max(0, Math.floor(state.pageIndex)) * limit;
  return { ...(q === '' ? {} : { q }), sort: state.sort, order: state.order, limit, offset };
}

/**
 * The sort for a header click as `matSort` reports it. A cleared direction (`''`) falls back to
 * the server's default for that column: labels A–Z, creation newest first.
 */
export function sortFromHeader(
  active: string,
  direction: SortOrder | '',
): Pick<VehicleListState, 'sort' | 'order'> {
  const sort: VehicleSort = active === 'createdAt' ? 'createdAt' : 'label';
  if (direction !== '') return { sort, order: direction };
  return { sort, order: sort === 'createdAt' ? 'desc' : 'asc' };
}

import {
  INITIAL_LIST_STATE,
  type VehicleListState,
  sortFromHeader,
  vehicleListQuery,
} from './vehicle-list-query';

describe('vehicleListQuery', () => {
  const state = (change: Partial<VehicleListState>): VehicleListState => ({
    ...INITIAL_LIST_STATE,
    ...change,
  });

  it.each([
    ['the first page', state({}), { sort: 'label', order: 'asc', limit: 25, offset: 0 }],
    [
      'a trimmed search',
      state({ search: '  hatch ' }),
      { q: 'hatch', sort: 'label', order: 'asc', limit: 25, offset: 0 },
    ],
    [
      'a blank search',
      state({ search: '   ' }),
      { sort: 'label', order: 'asc', limit: 25, offset: 0 },
    ],
    [
      'page 3 of 10 newest first',
      state({ sort: 'createdAt', order: 'desc', pageIndex: 2, pageSize: 10 }),
      { sort: 'createdAt', order: 'desc', limit: 10, offset: 20 },
    ],
    [
      'a page size above the server limit',
      state({ pageSize: 500, pageIndex: 1 }),
      { sort: 'label', order: 'asc', limit: 100, offset: 100 },
    ],
  ])('When asked for %s, then the query is as the server expects', (_name, input, expected) => {
    expect(vehicleListQuery(input)).toEqual(expected);
  });

  it('When the search is longer than the server takes, then it is cut to 100 characters', () => {
    expect(vehicleListQuery(state({ search: 'x'.repeat(150) })).q).toHaveLength(100);
  });
});

describe('sortFromHeader', () => {
  it.each([
    ['label', 'asc', { sort: 'label', order: 'asc' }],
    ['label', 'desc', { sort: 'label', order: 'desc' }],
    ['label', '', { sort: 'label', order: 'asc' }],
    ['createdAt', 'asc', { sort: 'createdAt', order: 'asc' }],
    ['createdAt', '', { sort: 'createdAt', order: 'desc' }],
    ['engine', 'desc', { sort: 'label', order: 'desc' }],
  ] as const)('When %s is sorted %p, then the list sorts %p', (active, direction, expected) => {
    expect(sortFromHeader(active, direction)).toEqual(expected);
  });
});

import { AREAS, areasFor, canEnterArea, canReadArea, hasAnyRole } from './access';

describe('areasFor', () => {
  it.each([
    [['admin'], ['vehicles', 'team']],
    [['tuner'], ['vehicles', 'logs', 'tables', 'plans', 'reviews']],
    [['operator'], ['vehicles', 'logs', 'plans']],
    [['reviewer'], ['vehicles', 'logs', 'tables', 'reviews']],
    [
      ['tuner', 'reviewer'],
      ['vehicles', 'logs', 'tables', 'plans', 'reviews'],
    ],
    [
      ['admin', 'operator'],
      ['vehicles', 'logs', 'plans', 'team'],
    ],
    [[], []],
  ] as const)('roles %j see %j in navigation order', (roles, expected) => {
    expect(areasFor(roles)).toEqual(expected);
  });

  it('keeps the navigation order of AREAS', () => {
    const all = areasFor(['admin', 'tuner', 'operator', 'reviewer']);
    expect(all).toEqual([...AREAS]);
  });
});

describe('canEnterArea', () => {
  it('lets only admins into the team area', () => {
    expect(canEnterArea(['admin'], 'team')).toBe(true);
    expect(canEnterArea(['tuner', 'operator', 'reviewer'], 'team')).toBe(false);
  });
});

describe('hasAnyRole', () => {
  it('is true when one role is shared and false otherwise', () => {
    expect(hasAnyRole(['tuner', 'reviewer'], ['reviewer'])).toBe(true);
    expect(hasAnyRole(['operator'], ['tuner', 'admin'])).toBe(false);
    expect(hasAnyRole(['operator'], [])).toBe(false);
  });
});

describe('canReadArea', () => {
  it('When an operator opens the tables area, then they may read it without working there', () => {
    expect(canReadArea(['operator'], 'tables')).toBe(true);
    expect(canEnterArea(['operator'], 'tables')).toBe(false);
  });

  it('When a role neither works in nor reads an area, then it may not open it', () => {
    expect(canReadArea(['admin'], 'tables')).toBe(false);
    expect(canReadArea(['operator'], 'team')).toBe(false);
    expect(canReadArea(['reviewer'], 'tables')).toBe(true);
  });
});

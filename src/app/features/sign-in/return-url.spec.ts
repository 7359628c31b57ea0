import { safeReturnUrl } from './return-url';

describe('safeReturnUrl', () => {
  it.each([
    [undefined, '/'],
    [null, '/'],
    ['', '/'],
    ['/plans', '/plans'],
    ['/tables/7?rev=2', '/tables/7?rev=2'],
    ['//evil.example', '/'],
    ['/\\evil.example', '/'],
    ['https://evil.example/', '/'],
    ['/sign-in?returnUrl=/x', '/'],
  ])('maps %p to %p', (candidate, expected) => {
    expect(safeReturnUrl(candidate)).toBe(expected);
  });
});

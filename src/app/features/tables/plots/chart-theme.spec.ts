import { FALLBACK_CHART_THEMES, chartTheme, resolveToken, schemeIsDark } from './chart-theme';

describe('chart theme', () => {
  it.each([
    ['dark', false, true],
    ['dark', true, true],
    ['light', true, false],
    ['light dark', true, true],
    ['light dark', false, false],
    ['normal', true, false],
    ['', true, false],
  ])(
    'When color-scheme is %j and the system prefers dark is %p, then dark is %p',
    (scheme, prefers, dark) => {
      expect(schemeIsDark(scheme, prefers)).toBe(dark);
    },
  );

  it.each([
    ['light-dark(#101010, #f0f0f0)', false, '#101010'],
    ['light-dark(#101010, #f0f0f0)', true, '#f0f0f0'],
    ['light-dark(rgb(1, 2, 3), rgb(4, 5, 6))', true, 'rgb(4, 5, 6)'],
    [' #abcdef ', true, '#abcdef'],
    ['', false, null],
    ['light-dark(#101010)', false, null],
  ])('When the token is %j and dark is %p, then it resolves to %p', (value, dark, colour) => {
    expect(resolveToken(value, dark)).toBe(colour);
  });

  it('When tokens are read, then each takes its half and missing ones fall back', () => {
    const tokens: Record<string, string> = {
      '--mat-sys-on-surface': 'light-dark(#111111, #eeeeee)',
      '--mat-sys-outline': '#777777',
    };
    const theme = chartTheme(true, (name) => tokens[name] ?? '');
    expect(theme).toEqual({
      ...FALLBACK_CHART_THEMES.dark,
      text: '#eeeeee',
      line: '#777777',
    });
    expect(chartTheme(false, () => '')).toEqual(FALLBACK_CHART_THEMES.light);
  });
});

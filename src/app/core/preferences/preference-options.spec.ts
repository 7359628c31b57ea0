import {
  DEFAULT_DISPLAY_PREFERENCES,
  MIXTURE_DISPLAYS,
  THEME_CHOICES,
  UNIT_SYSTEMS,
} from '@shared/contracts/preferences';
import {
  DEFAULT_PREFERENCES,
  MIXTURE_OPTIONS,
  THEME_OPTIONS,
  UNIT_OPTIONS,
} from './preference-options';

describe('preference options', () => {
  it('When the client defaults are compared with the API contract, then they agree', () => {
    expect(DEFAULT_PREFERENCES).toEqual(DEFAULT_DISPLAY_PREFERENCES);
  });

  it.each([
    ['units', UNIT_OPTIONS, UNIT_SYSTEMS],
    ['mixture', MIXTURE_OPTIONS, MIXTURE_DISPLAYS],
    ['theme', THEME_OPTIONS, THEME_CHOICES],
  ] as const)(
    'When the %s menu is listed, then it offers every choice of the contract',
    (_name, options, choices) => {
      expect(options.map((option) => option.value)).toEqual([...choices]);
    },
  );
});

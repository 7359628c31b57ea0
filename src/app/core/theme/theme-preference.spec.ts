import { TestBed } from '@angular/core/testing';
import { THEME_CHOICES } from '@shared/contracts/preferences';
import { COLOR_SCHEME_CHOICES, ThemePreference } from './theme-preference';

describe('ThemePreference', () => {
  beforeEach(() => {
    localStorage.clear();
    document.documentElement.className = '';
  });

  it('offers the same choices as the preferences contract, in the same order', () => {
    expect(COLOR_SCHEME_CHOICES).toEqual(THEME_CHOICES);
  });

  it('follows the system when nothing is stored', () => {
    const theme = TestBed.inject(ThemePreference);

    expect(theme.choice()).toBe('system');
    expect(document.documentElement.className).toBe('');
  });

  it('applies a choice as a class on <html> and remembers it', () => {
    TestBed.inject(ThemePreference).select('dark');

    expect(document.documentElement.classList.contains('cs-scheme-dark')).toBe(true);
    expect(localStorage.getItem('cellsmith.color-scheme')).toBe('dark');
  });

  it('restores a stored choice and ignores unknown values', () => {
    localStorage.setItem('cellsmith.color-scheme', 'light');
    expect(TestBed.inject(ThemePreference).choice()).toBe('light');

    TestBed.resetTestingModule();
    localStorage.setItem('cellsmith.color-scheme', 'purple');
    expect(TestBed.inject(ThemePreference).choice()).toBe('system');
  });
});

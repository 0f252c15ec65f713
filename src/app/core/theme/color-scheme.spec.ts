import { TestBed } from '@angular/core/testing';
import { COLOR_SCHEME_ATTRIBUTE, COLOR_SCHEME_STORAGE_KEY, ColorScheme } from './color-scheme';

describe('ColorScheme', () => {
  beforeEach(() => {
    localStorage.clear();
    document.documentElement.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
  });

  it('starts from a stored choice and applies it to the root element', () => {
    localStorage.setItem(COLOR_SCHEME_STORAGE_KEY, 'dark');
    const scheme = TestBed.inject(ColorScheme);
    TestBed.tick();
    expect(scheme.current()).toBe('dark');
    expect(document.documentElement.getAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe('dark');
  });

  it('toggles, remembers the choice and updates the root element', () => {
    localStorage.setItem(COLOR_SCHEME_STORAGE_KEY, 'light');
    const scheme = TestBed.inject(ColorScheme);
    scheme.toggle();
    TestBed.tick();
    expect(scheme.isDark()).toBe(true);
    expect(localStorage.getItem(COLOR_SCHEME_STORAGE_KEY)).toBe('dark');
    expect(document.documentElement.getAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe('dark');
  });

  it('ignores unknown stored values', () => {
    localStorage.setItem(COLOR_SCHEME_STORAGE_KEY, 'sepia');
    const scheme = TestBed.inject(ColorScheme);
    TestBed.tick();
    expect(scheme.current()).toBe('light');
    expect(document.documentElement.hasAttribute(COLOR_SCHEME_ATTRIBUTE)).toBe(false);
  });
});

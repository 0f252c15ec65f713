import { FALLBACK_LOCALE, pickLocale } from './user-locale';

describe('pickLocale', () => {
  it('takes the first preference Tidemark supports exactly', () => {
    expect(pickLocale(['en-AU', 'en-GB'])).toBe('en-AU');
    expect(pickLocale(['en-us'])).toBe('en-US');
  });

  it('falls back to the language when the region is not supported, in order of preference', () => {
    expect(pickLocale(['de-AT', 'en-US'])).toBe('de');
    expect(pickLocale(['ja-JP', 'fr-CH'])).toBe('fr');
  });

  it('reads any other English as British English, the product’s own', () => {
    expect(pickLocale(['en-ZA'])).toBe('en-GB');
    expect(pickLocale(['en'])).toBe('en-GB');
  });

  it('uses the product’s locale when nothing matches or nothing is asked for', () => {
    expect(pickLocale(['ja-JP', 'ko'])).toBe(FALLBACK_LOCALE);
    expect(pickLocale([])).toBe(FALLBACK_LOCALE);
  });
});

import { registerLocaleData } from '@angular/common';

/** Angular's locale data, loaded only for the locale in use (each is a chunk of its own). */
type LocaleLoader = () => Promise<{ default: unknown[] }>;

/**
 * Locales Tidemark formats dates and numbers for. en-US ships with Angular; the others are
 * English-speaking practices and the main Western European languages. Any other browser
 * language falls back to British English, the product's own.
 */
export const LOCALE_LOADERS: Readonly<Record<string, LocaleLoader | null>> = {
  'en-US': null,
  'en-GB': () => import('@angular/common/locales/en-GB'),
  'en-IE': () => import('@angular/common/locales/en-IE'),
  'en-AU': () => import('@angular/common/locales/en-AU'),
  'en-NZ': () => import('@angular/common/locales/en-NZ'),
  'en-CA': () => import('@angular/common/locales/en-CA'),
  de: () => import('@angular/common/locales/de'),
  fr: () => import('@angular/common/locales/fr'),
  es: () => import('@angular/common/locales/es'),
  it: () => import('@angular/common/locales/it'),
  nl: () => import('@angular/common/locales/nl'),
  pt: () => import('@angular/common/locales/pt'),
  sv: () => import('@angular/common/locales/sv'),
  da: () => import('@angular/common/locales/da'),
  nb: () => import('@angular/common/locales/nb'),
  fi: () => import('@angular/common/locales/fi'),
  pl: () => import('@angular/common/locales/pl'),
};

/** The product's own locale, used when the browser asks for none we have. */
export const FALLBACK_LOCALE = 'en-GB';

/**
 * The supported locale closest to the browser's preferences (`navigator.languages`, most
 * preferred first): an exact tag, else the same language (`de-AT` → `de`; any other English
 * → `en-GB`), tried in order of preference, else {@link FALLBACK_LOCALE}.
 *
 * @param preferred BCP 47 tags, most preferred first
 * @returns a key of {@link LOCALE_LOADERS}
 * @example pickLocale(['fr-CH', 'en']) // 'fr'
 */
export function pickLocale(preferred: readonly string[]): string {
  const supported = Object.keys(LOCALE_LOADERS);
  for (const tag of preferred) {
    const exact = supported.find((locale) => locale.toLowerCase() === tag.toLowerCase());
    if (exact) return exact;
    const language = tag.split('-')[0].toLowerCase();
    if (language === 'en') return FALLBACK_LOCALE;
    if (supported.includes(language)) return language;
  }
  return FALLBACK_LOCALE;
}

/** Picks the locale for these preferences and registers its data with Angular; resolves to its tag (for `LOCALE_ID`). */
export async function loadUserLocale(preferred: readonly string[]): Promise<string> {
  const locale = pickLocale(preferred);
  const loader = LOCALE_LOADERS[locale];
  if (loader) registerLocaleData((await loader()).default, locale);
  return locale;
}

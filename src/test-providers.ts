import { registerLocaleData } from '@angular/common';
import localeEnGb from '@angular/common/locales/en-GB';
import { LOCALE_ID, Provider } from '@angular/core';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';

// The app picks its locale from the browser (core/locale/user-locale.ts); tests pin the product's own, British English.
registerLocaleData(localeEnGb, 'en-GB');

/**
 * Providers every unit test starts with (angular.json `test.options.providersFile`).
 * jsdom fires no animation events, so Material's open/close animations are switched off
 * and dialogs and menus settle at once.
 */
const testProviders: Provider[] = [
  { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
  { provide: LOCALE_ID, useValue: 'en-GB' },
];

export default testProviders;

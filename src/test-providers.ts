import { Provider } from '@angular/core';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';

/**
 * Providers every unit test starts with (angular.json `test.options.providersFile`).
 * jsdom fires no animation events, so Material's open/close animations are switched off
 * and dialogs and menus settle at once.
 */
const testProviders: Provider[] = [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }];

export default testProviders;

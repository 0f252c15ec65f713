import { LOCALE_ID } from '@angular/core';
import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app.config';
import { loadUserLocale } from './app/core/locale/user-locale';

// Dates and numbers follow the browser's language; its locale data is loaded before the first page renders.
loadUserLocale(navigator.languages?.length ? navigator.languages : [navigator.language])
  .then((locale) => bootstrapApplication(App, { ...appConfig, providers: [...appConfig.providers, { provide: LOCALE_ID, useValue: locale }] }))
  .catch((error: unknown) => console.error(error));

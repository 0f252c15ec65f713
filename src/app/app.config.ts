import { HttpXsrfTokenExtractor, provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import {
  ApplicationConfig,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { TitleStrategy, provideRouter, withComponentInputBinding } from '@angular/router';
import { routes } from './app.routes';
import { AuthSession } from './core/auth/auth-session';
import { errorNoticeInterceptor } from './core/http/error-notice-interceptor';
import { sessionExpiryInterceptor } from './core/http/session-expiry-interceptor';
import { XsrfCookieExtractor } from './core/http/xsrf-cookie-extractor';
import { PageTitleStrategy } from './core/shell/page-title-strategy';
import { ColorScheme } from './core/theme/color-scheme';

/** Application-wide providers. */
export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    { provide: TitleStrategy, useClass: PageTitleStrategy },
    provideHttpClient(
      // Each handles a different concern of a failed call: an ended session, then a notice.
      withInterceptors([sessionExpiryInterceptor, errorNoticeInterceptor]),
      // The server issues a signed double-submit token in this cookie and checks the header
      // on every POST/PATCH/DELETE; Angular copies it for same-origin (relative) URLs.
      withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
    ),
    // …from `__Host-XSRF-TOKEN` instead when the installation is reached over HTTPS only.
    { provide: HttpXsrfTokenExtractor, useClass: XsrfCookieExtractor },
    // Icons come from the Material Symbols font shipped from npm (see angular.json styles).
    provideAppInitializer(() => {
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined', 'mat-ligature-font');
    }),
    provideAppInitializer(() => {
      inject(ColorScheme);
    }),
    // Knowing who is signed in before the first route is resolved keeps guards synchronous.
    provideAppInitializer(() => inject(AuthSession).restore()),
  ],
};

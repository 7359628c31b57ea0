import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import {
  type ApplicationConfig,
  ErrorHandler,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { routes } from './app.routes';
import { unauthorizedInterceptor } from './core/api/unauthorized-interceptor';
import { AppErrorHandler } from './core/error-handling/app-error-handler';
import { ThemePreference } from './core/theme/theme-preference';

/** Application-wide providers. */
export const appConfig: ApplicationConfig = {
  providers: [
    provideZonelessChangeDetection(),
    provideBrowserGlobalErrorListeners(),
    provideRouter(routes, withComponentInputBinding()),
    // The default XHR backend (not withFetch) because log uploads will report upload progress.
    provideHttpClient(
      withInterceptors([unauthorizedInterceptor]),
      withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
    ),
    { provide: ErrorHandler, useClass: AppErrorHandler },
    provideAppInitializer(() => {
      // Icons come from the self-hosted Material Symbols font (fonts/fonts.css).
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined');
      // Apply the remembered colour scheme before the first paint of any page.
      inject(ThemePreference);
    }),
  ],
};

import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import { type ApplicationConfig, provideBrowserGlobalErrorListeners } from '@angular/core';
import { provideClientHydration } from '@angular/platform-browser';
import { provideRouter, withComponentInputBinding, withPreloading } from '@angular/router';
import { routes } from './app.routes';
import { busyInterceptor } from './core/busy-interceptor';
import { csrfRetryInterceptor } from './core/csrf-retry-interceptor';
import { errorInterceptor } from './core/error-interceptor';
import { FacilitatorPreload } from './core/preload';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    // A participant's page arrives drawn by the server (app.routes.server.ts); the app takes over
    // that DOM instead of drawing it again. Pages drawn in the browser are unaffected. (No event
    // replay: it needs an inline script, which the page's CSP does not allow.)
    provideClientHydration(),
    provideRouter(routes, withComponentInputBinding(), withPreloading(FacilitatorPreload)),
    // The server sets XSRF-TOKEN; HttpClient echoes it as X-XSRF-TOKEN on writes.
    provideHttpClient(
      withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
      withInterceptors([busyInterceptor, errorInterceptor, csrfRetryInterceptor]),
    ),
  ],
};

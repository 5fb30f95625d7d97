import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import { type ApplicationConfig, provideBrowserGlobalErrorListeners } from '@angular/core';
import { provideRouter, withComponentInputBinding, withPreloading } from '@angular/router';
import { routes } from './app.routes';
import { busyInterceptor } from './core/busy-interceptor';
import { csrfRetryInterceptor } from './core/csrf-retry-interceptor';
import { errorInterceptor } from './core/error-interceptor';
import { FacilitatorPreload } from './core/preload';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideRouter(routes, withComponentInputBinding(), withPreloading(FacilitatorPreload)),
    // The server sets XSRF-TOKEN; HttpClient echoes it as X-XSRF-TOKEN on writes.
    provideHttpClient(
      withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
      withInterceptors([busyInterceptor, errorInterceptor, csrfRetryInterceptor]),
    ),
  ],
};

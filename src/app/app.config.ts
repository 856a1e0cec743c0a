import { ApplicationConfig, inject, provideAppInitializer, provideBrowserGlobalErrorListeners } from '@angular/core';
import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { routes } from './app.routes';
import { AuthService } from './core/auth/auth-service';
import { CSRF_COOKIE, CSRF_HEADER } from '@shared/contracts/constants';
import { unauthorizedInterceptor } from './core/http/unauthorized-interceptor';

// Angular 21 bootstraps zoneless by default; no zone.js polyfill and no provider needed.
export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideRouter(routes, withComponentInputBinding()),
    provideHttpClient(
      withInterceptors([unauthorizedInterceptor]),
      withXsrfConfiguration({ cookieName: CSRF_COOKIE, headerName: CSRF_HEADER }),
    ),
    // Guards read the signed-in user synchronously, so learn it before the first navigation.
    provideAppInitializer(() => inject(AuthService).loadCurrentUser()),
  ],
};

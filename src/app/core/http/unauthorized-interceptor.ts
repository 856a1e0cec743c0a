import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { AuthService } from '../auth/auth-service';
import { signInUrl } from '../auth/sign-in-url';

// A 401 from these is an answer the caller handles itself (wrong password, nobody signed in yet,
// signing out of a session that has already ended).
const ANSWERED_BY_CALLER = ['/api/auth/sign-in', '/api/auth/me', '/api/auth/sign-out'];

/** When the API says the session is gone, forget the user and send them to sign in and back. */
export const unauthorizedInterceptor: HttpInterceptorFn = (request, next) => {
  const auth = inject(AuthService);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      const path = request.url.split('?')[0];
      if (
        error instanceof HttpErrorResponse &&
        error.status === 401 &&
        path.startsWith('/api/') &&
        !ANSWERED_BY_CALLER.includes(path)
      ) {
        auth.forgetUser();
        // During a navigation the user was on their way to its target; come back there. When that
        // target is already the sign-in page (several requests failed at once), it keeps its returnUrl.
        const target = router.currentNavigation()?.finalUrl;
        const where = target ? router.serializeUrl(target) : router.url;
        if (!where.startsWith('/sign-in')) void router.navigateByUrl(signInUrl(router, where));
      }
      return throwError(() => error);
    }),
  );
};

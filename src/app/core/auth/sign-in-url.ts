import { Router, UrlTree } from '@angular/router';

/** The sign-in page, remembering where to come back to. */
export function signInUrl(router: Router, returnUrl: string): UrlTree {
  const keep = returnUrl !== '' && returnUrl !== '/' && !returnUrl.startsWith('/sign-in');
  return router.createUrlTree(['/sign-in'], keep ? { queryParams: { returnUrl } } : {});
}

/** A return address is only followed when it stays inside the app (no `//host` or `https:`). */
export function safeReturnUrl(returnUrl: string | null | undefined): string {
  if (!returnUrl || !returnUrl.startsWith('/') || returnUrl.startsWith('//') || returnUrl.startsWith('/\\')) {
    return '/designs';
  }
  return returnUrl.startsWith('/sign-in') ? '/designs' : returnUrl;
}

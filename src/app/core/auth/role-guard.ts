import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import type { Role } from '@shared/contracts/user';
import { AuthService } from './auth-service';
import { signInUrl } from './sign-in-url';

/** Lets through users holding one of the roles; others land on the Designs page. */
export function roleGuard(...roles: Role[]): CanActivateFn {
  return (_route, state) => {
    const auth = inject(AuthService);
    const router = inject(Router);
    const role = auth.role();
    if (role === null) return signInUrl(router, state.url);
    return roles.includes(role) || router.createUrlTree(['/designs']);
  };
}

import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { AuthService } from './auth-service';
import { signInUrl } from './sign-in-url';

/** Lets signed-in users through; sends everyone else to sign in and back. */
export const authGuard: CanActivateFn = (_route, state) =>
  inject(AuthService).signedIn() || signInUrl(inject(Router), state.url);

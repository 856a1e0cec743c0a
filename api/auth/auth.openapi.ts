import { changePasswordSchema, meSchema, sessionSchema, signInSchema } from '@shared/contracts/auth';
import type { Operation } from '../openapi/operation';

export const authOperations: Operation[] = [
  {
    method: 'post',
    path: '/api/auth/sign-in',
    summary: 'Sign in with e-mail and password; sets the session cookie and returns a token for scripts',
    tag: 'Sign-in',
    access: 'public',
    body: signInSchema,
    responses: {
      200: { description: 'Signed in', schema: sessionSchema },
      400: { description: 'Body not valid' },
      401: { description: 'Wrong e-mail or password, or account disabled' },
      429: { description: 'Too many attempts (Retry-After header in seconds)' },
    },
  },
  {
    method: 'post',
    path: '/api/auth/sign-out',
    summary: 'End this session (the token stops working at once)',
    tag: 'Sign-in',
    access: 'any',
    responses: { 204: { description: 'Signed out' } },
  },
  {
    method: 'get',
    path: '/api/auth/me',
    summary: 'The signed-in user',
    tag: 'Sign-in',
    access: 'any',
    responses: { 200: { description: 'The user', schema: meSchema } },
  },
  {
    method: 'post',
    path: '/api/auth/password',
    summary: 'Change your own password; ends your other sessions',
    tag: 'Sign-in',
    access: 'any',
    body: changePasswordSchema,
    responses: { 204: { description: 'Changed' }, 400: { description: 'Current password wrong or new one not accepted' } },
  },
];

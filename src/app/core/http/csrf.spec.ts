import { CSRF_COOKIE, CSRF_HEADER } from '@shared/contracts/auth';
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from './csrf';

describe('CSRF names', () => {
  it('should match the cookie and header names of the API contract', () => {
    expect(CSRF_COOKIE_NAME).toBe(CSRF_COOKIE);
    expect(CSRF_HEADER_NAME).toBe(CSRF_HEADER);
  });
});
